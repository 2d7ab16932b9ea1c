// Who may do what: the one table every route's guard reads. Row scope (an instructor sees only their own
// rows) is applied by the services through `rowScope`.
import type { UserRole } from "../../shared/domain";

export const permissions = {
  manageUsers: ["coordinator"],
  manageSites: ["coordinator"],
  readDirectory: ["coordinator", "quality_lead"],
  importData: ["coordinator", "instructor"],
  undoImport: ["coordinator"],
  /** The filter bar's choices; what each role gets is narrowed by the insight options service. */
  readInsightOptions: ["coordinator", "quality_lead", "instructor", "funder"],
  /** The token that tells an open page the figures may have changed; it reveals nothing else. */
  watchDataVersion: ["coordinator", "quality_lead", "instructor", "funder"],
  readNetwork: ["coordinator", "quality_lead", "instructor"],
  drillDown: ["coordinator", "quality_lead"],
  readOwnStanding: ["instructor"],
  readEquipment: ["coordinator", "quality_lead", "instructor"],
  readReport: ["coordinator", "funder"],
  sendReport: ["coordinator"],
  readSettings: ["coordinator", "quality_lead"],
  editSettings: ["coordinator"],
} as const satisfies Record<string, readonly UserRole[]>;

export type Permission = keyof typeof permissions;

export function roleMay(role: UserRole, permission: Permission): boolean {
  return (permissions[permission] as readonly UserRole[]).includes(role);
}
