// The kinds of signal the digest after an import can hold, their names and one-line explanations (the account
// page, the alerts history and the digest read them from here), and which kinds each role receives until its
// user chooses. A role without `receiveImportAlerts` (shared/permissions.ts) receives none, whatever is stored.
import type { UserRole } from "./domain";

export const alertKinds = ["funnel", "shift", "service", "drift", "noData"] as const;
export type AlertKind = (typeof alertKinds)[number];

export const alertKindLabels: Record<AlertKind, string> = {
  funnel: "Instructors outside the funnel limits",
  shift: "Shifts in the monthly pass rate",
  service: "Manikins due for service",
  drift: "Manikins reading differently from their peers",
  noData: "Sites with no data this quarter",
};

export const alertKindExplanations: Record<AlertKind, string> = {
  funnel: "An instructor's measured pass rate in the newest quarter lies outside the funnel's 99.8 % limits.",
  shift: "The monthly measured pass rate of the network or a site has run on one side of its median for longer than chance explains.",
  service: "A manikin has passed its service interval in compressions or days.",
  drift: "A manikin's depth readings differ from those of the other manikins in the same classes.",
  noData: "A site sent attempts or class logs in the quarter before the newest one, but none in the newest.",
};

/** What a role receives until the user chooses; instructors only about their own site and themselves. */
export function defaultAlertKinds(role: UserRole): AlertKind[] {
  if (role === "coordinator" || role === "quality_lead") return [...alertKinds];
  if (role === "instructor") return ["service", "drift"];
  return [];
}
