// What the alerts page lists: the signals mailed to the reader, newest first, and for a coordinator every
// user's, each signal once with how many people it went to. Links are kept as mailed: each was chosen for its
// recipient's role (./signalLines.ts), so a user's own rows only hold links they may open.
import { desc, eq, inArray, min } from "drizzle-orm";
import { can } from "../../shared/permissions";
import type { AllAlertsAnswer, MyAlertsAnswer } from "../../shared/schemas/alerts";
import type { Db } from "../db/client";
import { alertDeliveries, users } from "../db/schema";

/** Enough for a page read now and then; older deliveries stay in the table. */
const LIMIT = 500;

const linkOf = (row: { linkPath: string | null; linkLabel: string | null }) =>
  row.linkPath !== null && row.linkLabel !== null ? { path: row.linkPath, label: row.linkLabel } : null;

export function myAlerts(db: Db, userId: number): MyAlertsAnswer {
  const rows = db
    .select()
    .from(alertDeliveries)
    .where(eq(alertDeliveries.userId, userId))
    .orderBy(desc(alertDeliveries.sentAt), desc(alertDeliveries.id))
    .limit(LIMIT)
    .all();
  return { deliveries: rows.map((row) => ({ key: row.key, kind: row.kind, summary: row.summary, sentAt: row.sentAt, link: linkOf(row) })) };
}

/**
 * Each signal once: when it first went out, and to how many people. Its link is one mailed to a role that
 * reaches every row, which a coordinator can open too; a signal mailed only to instructors (whose links lead to
 * their own pages) is listed without one.
 */
export function allAlerts(db: Db): AllAlertsAnswer {
  // the newest signals by when each first went out, chosen in SQL so only their deliveries are read
  const newestSignals = db
    .select({ key: alertDeliveries.key })
    .from(alertDeliveries)
    .groupBy(alertDeliveries.key)
    .orderBy(desc(min(alertDeliveries.sentAt)), alertDeliveries.key)
    .limit(LIMIT);
  const rows = db
    .select({ delivery: alertDeliveries, role: users.role })
    .from(alertDeliveries)
    .innerJoin(users, eq(users.id, alertDeliveries.userId))
    .where(inArray(alertDeliveries.key, newestSignals))
    .orderBy(alertDeliveries.sentAt, alertDeliveries.id)
    .all();
  const bySignal = new Map<string, AllAlertsAnswer["signals"][number] & { people: Set<number> }>();
  for (const { delivery, role } of rows) {
    const link = can(role, "receiveImportAlerts", "any") ? linkOf(delivery) : null;
    const signal = bySignal.get(delivery.key);
    if (!signal) {
      bySignal.set(delivery.key, {
        key: delivery.key,
        kind: delivery.kind,
        summary: delivery.summary,
        sentAt: delivery.sentAt,
        link,
        recipients: 0,
        people: new Set([delivery.userId]),
      });
    } else {
      signal.people.add(delivery.userId);
      signal.link ??= link;
    }
  }
  const signals = [...bySignal.values()]
    .map(({ people, ...signal }) => ({ ...signal, recipients: people.size }))
    .sort((a, b) => (a.sentAt === b.sentAt ? a.key.localeCompare(b.key) : a.sentAt < b.sentAt ? 1 : -1));
  return { signals };
}
