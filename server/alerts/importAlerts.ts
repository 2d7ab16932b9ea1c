// The digest mailed after an import: the signals that hold now and were not mailed before, one message to
// each active user whose role receives import alerts (shared/permissions.ts). The message names instructors
// by code only. A signal is recorded as sent once every message went out, so a failed send is tried again
// after the next import; without a mail server nothing is sent or recorded.
import { and, eq, inArray } from "drizzle-orm";
import { rolesWith } from "../../shared/permissions";
import { quarterLabel } from "../../shared/period";
import { SAFETY_NOTE } from "../../shared/scoring/policy";
import type { Db } from "../db/client";
import { alertLog, users } from "../db/schema";
import { MailNotConfiguredError, type Mailer } from "../mail/mailer";
import { logImportAlerts } from "../logging/events";
import type { Logger } from "../logging/logger";
import { currentSignals, signalKeys, type Signals } from "./signals";

export type AlertOutcome =
  | { status: "nothing-new" }
  | { status: "sent"; recipients: number; signals: number }
  | { status: "not-configured" }
  | { status: "failed"; error: string };

function unsent(db: Db, signals: Signals): Signals {
  const keys = signalKeys(signals);
  if (keys.length === 0) return signals;
  const sent = new Set(db.select({ key: alertLog.key }).from(alertLog).where(inArray(alertLog.key, keys)).all().map((row) => row.key));
  const fresh = <T extends { key: string }>(list: T[]) => list.filter((s) => !sent.has(s.key));
  return { funnel: fresh(signals.funnel), service: fresh(signals.service), drift: fresh(signals.drift) };
}

const mm = (value: number) => `${value > 0 ? "+" : value < 0 ? "−" : ""}${Math.abs(value).toFixed(1)} mm`;

export function digestText(signals: Signals): string {
  const lines = ["Quarterbeat checked the figures after the latest import and found something new to look at.", ""];
  if (signals.funnel.length > 0) {
    lines.push(`Instructors outside the 99.8 % funnel limits around the network's measured pass rate in ${quarterLabel(signals.funnel[0].quarter)}:`);
    for (const s of signals.funnel) lines.push(`  - ${s.instructorCode}: ${s.side} the limits (${s.passed} of ${s.attempts} attempts passed)`);
    lines.push("");
  }
  if (signals.service.length > 0) {
    lines.push("Manikins due for service:");
    for (const s of signals.service) lines.push(`  - ${s.assetId}${s.siteCode ? ` (${s.siteCode})` : ""}: ${s.reason}`);
    lines.push("");
  }
  if (signals.drift.length > 0) {
    const { from, to } = signals.drift[0];
    lines.push(`Manikins whose depth readings differ from their peers' in the same classes, ${quarterLabel(from)} to ${quarterLabel(to)}:`);
    for (const s of signals.drift) {
      lines.push(`  - ${s.assetId}${s.siteCode ? ` (${s.siteCode})` : ""}: reads ${mm(s.offsetMm)} against its peers over ${s.classes} shared classes (95 % interval ${mm(s.ci95[0])} to ${mm(s.ci95[1])}); check the depth sensor before drawing conclusions about learners or instructors.`);
    }
    lines.push("");
  }
  lines.push(
    "Open Quarterbeat's Instructors and Equipment pages for the details. A point outside the limits is a reason to look, not a judgement of a person.",
    SAFETY_NOTE,
  );
  return lines.join("\n");
}

export async function sendImportAlerts(db: Db, mailer: Mailer, asOf: string = new Date().toISOString().slice(0, 10)): Promise<AlertOutcome> {
  const fresh = unsent(db, currentSignals(db, asOf));
  const keys = signalKeys(fresh);
  if (keys.length === 0) return { status: "nothing-new" };
  const recipients = db
    .select({ email: users.email })
    .from(users)
    .where(and(eq(users.active, true), inArray(users.role, rolesWith("receiveImportAlerts"))))
    .all();
  if (recipients.length === 0) return { status: "nothing-new" };
  const subject = `Quarterbeat: ${keys.length} new signal${keys.length === 1 ? "" : "s"} after the latest import`;
  const text = digestText(fresh);
  try {
    for (const { email } of recipients) await mailer.send({ to: [email], subject, text });
  } catch (err) {
    if (err instanceof MailNotConfiguredError) return { status: "not-configured" };
    return { status: "failed", error: (err as Error).message };
  }
  db.insert(alertLog).values(keys.map((key) => ({ key }))).onConflictDoNothing().run();
  return { status: "sent", recipients: recipients.length, signals: keys.length };
}

/** Runs the digest without holding up the import it follows; the outcome goes on the log, never an exception. */
export function alertAfterImport(db: Db, mailer: Mailer, logger: Logger): Promise<void> {
  return sendImportAlerts(db, mailer).then(
    (outcome) => logImportAlerts(logger, outcome),
    () => logImportAlerts(logger, { status: "failed" }),
  );
}
