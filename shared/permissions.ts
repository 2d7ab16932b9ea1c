// Who may do what: the one table the server's route guards and services and the client's pages and
// navigation all read. Each permission lists the roles that hold it and how far it reaches:
//   "any" — every row the permission covers;
//   "own" — only the user's own rows: their instructor's classes and attempts, their site's equipment, the
//           uploads, jobs, presets and import batches they made themselves.
// A role missing from a row does not hold that permission at all. What every signed-in user may do (their own
// account: preferences, password) needs no permission.
import type { UserRole } from "./domain";
import { userRoles } from "./domain";

export type Reach = "any" | "own";

type Grants = Partial<Record<UserRole, Reach>>;

const everyone: Grants = { coordinator: "any", quality_lead: "any", instructor: "any", funder: "any" };

export const permissionTable = {
  manageUsers: { coordinator: "any" },
  manageSites: { coordinator: "any" },
  readDirectory: { coordinator: "any", quality_lead: "any" },
  /** Class logs, attempts and streams; an instructor only for their own classes, and sees only their own batches. */
  importData: { coordinator: "any", instructor: "own" },
  /** Equipment logs describe every site's manikins, so only a role with network-wide reach imports them. */
  importEquipment: { coordinator: "any" },
  undoImport: { coordinator: "any" },
  /** The filter bar's choices; what each role gets is narrowed by the insight options service. */
  readInsightOptions: everyone,
  /** The token that tells an open page the figures may have changed; it reveals nothing else. */
  watchDataVersion: everyone,
  /** Network figures, with groups of others' attempts that are too small suppressed for roles without drill-down. */
  readNetwork: { coordinator: "any", quality_lead: "any", instructor: "any" },
  /** Classes and attempts row by row; another instructor's rows are answered as missing. */
  readAttempts: { coordinator: "any", quality_lead: "any", instructor: "own" },
  /** Per-instructor tables and error breakdowns. */
  drillDown: { coordinator: "any", quality_lead: "any" },
  readOwnStanding: { instructor: "own" },
  /** Instructors' pass/fail against the measurement: an instructor sees only their own, in private. */
  readCalibration: { coordinator: "any", quality_lead: "any", instructor: "own" },
  /** The fleet and consumables; an instructor sees their own site's manikins and their own classes. */
  readEquipment: { coordinator: "any", quality_lead: "any", instructor: "own" },
  /** Improvement actions; an instructor sees those whose scope is the network, their site or themselves. */
  readActions: { coordinator: "any", quality_lead: "any", instructor: "own" },
  /** Record and change improvement actions and their notes. */
  manageActions: { coordinator: "any", quality_lead: "any" },
  /**
   * The digest mailed after an import (shared/alertKinds.ts), its choice on the account page and the history of
   * what was mailed; an instructor only signals about their own site and themselves.
   */
  receiveImportAlerts: { coordinator: "any", quality_lead: "any", instructor: "own" },
  /** Every user's alerts history: which signal went to how many people. */
  readAllAlerts: { coordinator: "any" },
  /** The quarter tracker: which instructors' class logs and attempts have arrived, and refused rows to fix. */
  readTracker: { coordinator: "any" },
  readReport: { coordinator: "any", funder: "any" },
  sendReport: { coordinator: "any" },
  readSettings: { coordinator: "any", quality_lead: "any" },
  editSettings: { coordinator: "any" },
  /** The installation: database size and growth, backups, imports, mail, version and schema level. */
  readSystem: { coordinator: "any" },
} as const satisfies Record<string, Grants>;

export type Permission = keyof typeof permissionTable;

export const permissions = Object.keys(permissionTable) as Permission[];

export function isPermission(name: string): name is Permission {
  return Object.hasOwn(permissionTable, name);
}

/** How far a role's permission reaches, or null when the role lacks it. */
export function reachOf(role: UserRole, permission: Permission): Reach | null {
  return (permissionTable[permission] as Grants)[role] ?? null;
}

/**
 * Whether a user (or a role) holds a permission. `needs: "any"` asks for network-wide reach, e.g. whether a
 * user may see everyone's import batches rather than only their own.
 */
export function can(who: { role: UserRole } | UserRole, permission: Permission, needs: Reach = "own"): boolean {
  const reach = reachOf(typeof who === "string" ? who : who.role, permission);
  return reach === "any" || (reach === "own" && needs === "own");
}

/** The roles that hold a permission, in the order of `userRoles` (for "open to … accounts"). */
export function rolesWith(permission: Permission): UserRole[] {
  return userRoles.filter((role) => reachOf(role, permission) !== null);
}
