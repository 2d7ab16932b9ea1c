// The digest mailed after an import: each active user whose role receives import alerts (shared/permissions.ts)
// gets their own message with the signals that hold now, of the kinds they chose and about what they may see
// (./audience.ts), and that were not mailed to them before. The message names instructors by code only.
//
// Deliveries are recorded per user and signal (alert_deliveries) once that user's message went out, so a failed
// send is tried again after the next import, and a user who turns a kind on later receives the signals of that
// kind that still hold at the next import — current signals, never ones that have since cleared. Without a
// mail server nothing is sent or recorded. Nobody is sent an empty message.
import { and, eq, inArray } from "drizzle-orm";
import { rolesWith } from "../../shared/permissions";
import { quarterLabel } from "../../shared/period";
import { SAFETY_NOTE } from "../../shared/scoring/policy";
import type { Db } from "../db/client";
import { alertDeliveries, instructors, sites, users } from "../db/schema";
import { MailNotConfiguredError, type Mailer } from "../mail/mailer";
import { logImportAlerts } from "../logging/events";
import type { Logger } from "../logging/logger";
import { chosenKinds, signalsFor, type Recipient } from "./audience";
import { monthLabel, monthsLabel, scopeLabel, signalLine, signalLink } from "./signalLines";
import { answerText } from "../offThread/pool";
import { currentSignals, signalList, signalsOf, type Signals, type TaggedSignal } from "./signals";

const today = () => new Date().toISOString().slice(0, 10);

export type AlertOutcome =
  { status: "nothing-new" } | { status: "sent"; recipients: number; signals: number } | { status: "not-configured" } | { status: "failed"; error: string };

function recipients(db: Db): Recipient[] {
  return db
    .select({ id: users.id, email: users.email, role: users.role, alertKinds: users.alertKinds, instructorCode: instructors.code, siteCode: sites.code })
    .from(users)
    .leftJoin(instructors, eq(instructors.id, users.instructorId))
    .leftJoin(sites, eq(sites.id, instructors.siteId))
    .where(and(eq(users.active, true), inArray(users.role, rolesWith("receiveImportAlerts"))))
    .orderBy(users.id)
    .all();
}

function unsentTo(db: Db, userId: number, list: TaggedSignal[]): TaggedSignal[] {
  if (list.length === 0) return list;
  const keys = list.map((item) => item.signal.key);
  const sent = new Set(
    db
      .select({ key: alertDeliveries.key })
      .from(alertDeliveries)
      .where(and(eq(alertDeliveries.userId, userId), inArray(alertDeliveries.key, keys)))
      .all()
      .map((row) => row.key),
  );
  return list.filter((item) => !sent.has(item.signal.key));
}

const mm = (value: number) => `${value > 0 ? "+" : value < 0 ? "−" : ""}${Math.abs(value).toFixed(1)} mm`;

export function digestText(signals: Signals): string {
  const lines = ["Quarterbeat checked the figures after the latest import and found something new to look at.", ""];
  if (signals.funnel.length > 0) {
    lines.push(`Instructors outside the 99.8 % funnel limits around the network's measured pass rate in ${quarterLabel(signals.funnel[0].quarter)}:`);
    for (const s of signals.funnel) lines.push(`  - ${s.instructorCode}: ${s.side} the limits (${s.passed} of ${s.attempts} attempts passed)`);
    lines.push("");
  }
  if (signals.shift.length > 0) {
    lines.push(
      "Monthly measured pass rate running on one side of its median up to the newest month (a reason to look at what changed, not proof of its cause):",
    );
    for (const s of signals.shift) {
      lines.push(
        `  - ${scopeLabel(s.siteCode)}: ${s.direction} its median in ${monthsLabel(s.months)} from ${monthLabel(s.since)} to ${monthLabel(s.through)}; a run of more than ${monthsLabel(s.runLimit)}, or so few crossings of the median, is unlikely by chance.`,
      );
    }
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
      lines.push(
        `  - ${s.assetId}${s.siteCode ? ` (${s.siteCode})` : ""}: reads ${mm(s.offsetMm)} against its peers over ${s.classes} shared classes (95 % interval ${mm(s.ci95[0])} to ${mm(s.ci95[1])}); check the depth sensor before drawing conclusions about learners or instructors.`,
      );
    }
    lines.push("");
  }
  if (signals.noData.length > 0) {
    lines.push(
      `Sites with no attempts or class logs in ${quarterLabel(signals.noData[0].quarter)} so far, after some in ${quarterLabel(signals.noData[0].previous)}:`,
    );
    for (const s of signals.noData) lines.push(`  - ${s.siteCode}: check whether its files are still to come.`);
    lines.push("");
  }
  lines.push(
    "Open Alerts in Quarterbeat for the page behind each signal. A point outside the limits is a reason to look, not a judgement of a person.",
    SAFETY_NOTE,
  );
  return lines.join("\n");
}

/** `signals`: those holding now, when the caller worked them out already (off the event loop); else read here. */
/** Whether any active user would receive a digest: without one, the network-wide checks are not worth running. */
export function anyoneReceivesAlerts(db: Db): boolean {
  return recipients(db).some((recipient) => chosenKinds(recipient.role, recipient.alertKinds).length > 0);
}

export async function sendImportAlerts(db: Db, mailer: Mailer, asOf: string = today(), signals?: Signals): Promise<AlertOutcome> {
  if (!anyoneReceivesAlerts(db)) return { status: "nothing-new" };
  const list = signalList(signals ?? currentSignals(db, asOf));
  if (list.length === 0) return { status: "nothing-new" };
  const delivered = new Set<string>();
  let messages = 0;
  for (const recipient of recipients(db)) {
    const fresh = unsentTo(db, recipient.id, signalsFor(recipient, list));
    if (fresh.length === 0) continue;
    const subject = `Quarterbeat: ${fresh.length} new signal${fresh.length === 1 ? "" : "s"} after the latest import`;
    try {
      await mailer.send({ to: [recipient.email], subject, text: digestText(signalsOf(fresh)) });
    } catch (err) {
      if (err instanceof MailNotConfiguredError) return { status: "not-configured" };
      return { status: "failed", error: (err as Error).message };
    }
    recordDeliveries(db, recipient, fresh);
    for (const item of fresh) delivered.add(item.signal.key);
    messages += 1;
  }
  if (messages === 0) return { status: "nothing-new" };
  return { status: "sent", recipients: messages, signals: delivered.size };
}

function recordDeliveries(db: Db, recipient: Recipient, fresh: readonly TaggedSignal[]) {
  db.insert(alertDeliveries)
    .values(
      fresh.map((item) => {
        const link = signalLink(recipient.role, item);
        return {
          userId: recipient.id,
          key: item.signal.key,
          kind: item.kind,
          summary: signalLine(item),
          linkPath: link?.path ?? null,
          linkLabel: link?.label ?? null,
        };
      }),
    )
    .onConflictDoNothing()
    .run();
}

/** The digest still running for each database: the next one waits for it (see alertAfterImport). */
const digestInFlight = new WeakMap<Db, Promise<void>>();

/**
 * Runs the digest without holding up the import it follows; the outcome goes on the log, never an exception.
 * Digests of one database run one after another: two imports that finish together would otherwise both find
 * a signal unsent to someone and both mail it.
 */
export function alertAfterImport(db: Db, mailer: Mailer, logger: Logger): Promise<void> {
  const previous = digestInFlight.get(db) ?? Promise.resolve();
  const next = previous.then(() => runDigest(db, mailer, logger));
  digestInFlight.set(db, next);
  return next;
}

function runDigest(db: Db, mailer: Mailer, logger: Logger): Promise<void> {
  const asOf = today();
  if (!anyoneReceivesAlerts(db)) return Promise.resolve();
  // the signals read the whole network: worked out in the answer worker, so the server keeps answering meanwhile
  return Promise.resolve(answerText(db, `signals|${asOf}`, "signals", [asOf]))
    .then((text) => sendImportAlerts(db, mailer, asOf, JSON.parse(text) as Signals))
    .then(
      (outcome) => logImportAlerts(logger, outcome),
      () => logImportAlerts(logger, { status: "failed" }),
    );
}
