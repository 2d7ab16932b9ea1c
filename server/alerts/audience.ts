// Who receives which signal. A role reaching every row (coordinator, quality lead) may be told every signal; an
// instructor ("own" reach of receiveImportAlerts) only about themselves and their own site: their own funnel
// position, their site's manikins, shift and quiet quarter — never another instructor's code, never the network's
// monthly series (months are finer than the released grid). Each user then receives the kinds they chose.
import { defaultAlertKinds, type AlertKind } from "../../shared/alertKinds";
import { can } from "../../shared/permissions";
import type { UserRole } from "../../shared/domain";
import type { TaggedSignal } from "./signals";

export interface Recipient {
  id: number;
  email: string;
  role: UserRole;
  /** Null until the user chooses. */
  alertKinds: AlertKind[] | null;
  instructorCode: string | null;
  siteCode: string | null;
}

/** The kinds a user receives: their choice, or their role's defaults; none without the permission. */
export function chosenKinds(role: UserRole, stored: AlertKind[] | null): AlertKind[] {
  if (!can(role, "receiveImportAlerts")) return [];
  return stored ?? defaultAlertKinds(role);
}

/** Whether the signal may be told to this user at all, whatever they chose. */
export function mayBeTold(recipient: Recipient, item: TaggedSignal): boolean {
  if (can(recipient.role, "receiveImportAlerts", "any")) return true;
  if (!can(recipient.role, "receiveImportAlerts")) return false;
  if (item.kind === "funnel") return recipient.instructorCode !== null && item.signal.instructorCode === recipient.instructorCode;
  return recipient.siteCode !== null && item.signal.siteCode === recipient.siteCode;
}

/** The signals of a list this user receives, in the list's order. */
export function signalsFor(recipient: Recipient, list: readonly TaggedSignal[]): TaggedSignal[] {
  const kinds = new Set(chosenKinds(recipient.role, recipient.alertKinds));
  return list.filter((item) => kinds.has(item.kind) && mayBeTold(recipient, item));
}
