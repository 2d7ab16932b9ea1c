// One manikin's record: where it is, its service state and what is due, its use per quarter, its equipment
// log, and its depth readings against the other manikins of its patient type in the same classes — the page a
// flagged manikin, a fleet row or an attention item leads to.
import { count, desc, eq } from "drizzle-orm";
import type { ManikinRecord } from "../../shared/schemas/equipment";
import type { EquipmentPolicy } from "../../shared/scoring/policy";
import type { Db } from "../db/client";
import { equipmentEvents, manikins } from "../db/schema";
import { notFound } from "../errors";
import { driftRule, manikinDriftReport } from "../metrics/manikinDrift";
import { fleetAttention, fleetRecords, thresholds, type EquipmentScope } from "./service";

/** Log lines sent with the record; the page says how many more there are. */
export const LOG_LINES_SHOWN = 200;

export interface ManikinRecordOptions {
  /** Only a manikin of this site may be opened (an instructor's own site); null for the whole fleet. */
  onlySiteId: number | null;
  /** Whether the paired classes behind the drift are named (those who see every site's classes). */
  showClasses: boolean;
}

export function manikinRecord(db: Db, policy: EquipmentPolicy, assetId: string, scope: EquipmentScope, options: ManikinRecordOptions): ManikinRecord {
  const manikin = db.select({ id: manikins.id, siteId: manikins.siteId }).from(manikins).where(eq(manikins.assetId, assetId)).get();
  // another site's manikin answers as a missing one: its asset id is not the instructor's to confirm
  if (!manikin || (options.onlySiteId !== null && manikin.siteId !== options.onlySiteId)) throw notFound(`Manikin ${assetId}`);

  const filters = { ...scope.filters, siteId: null, profile: null, manikinId: manikin.id };
  const [record] = fleetRecords(db, { ...scope, filters });
  const rule = driftRule(policy);
  const drift =
    manikinDriftReport(db, { from: filters.period.from, to: filters.period.to, siteId: manikin.siteId, options: rule }).find(
      (row) => row.manikin === assetId,
    ) ?? null;
  const log = db
    .select({
      date: equipmentEvents.date,
      event: equipmentEvents.event,
      quantity: equipmentEvents.quantity,
      note: equipmentEvents.note,
      resolved: equipmentEvents.resolved,
    })
    .from(equipmentEvents)
    .where(eq(equipmentEvents.manikinId, manikin.id))
    .orderBy(desc(equipmentEvents.date), desc(equipmentEvents.id))
    .limit(LOG_LINES_SHOWN)
    .all();
  const logTotal = db.select({ n: count() }).from(equipmentEvents).where(eq(equipmentEvents.manikinId, manikin.id)).get()?.n ?? 0;

  return {
    period: filters.period,
    asOf: scope.asOf,
    thresholds: thresholds(policy),
    manikin: record,
    attention: fleetAttention([record], policy, scope.asOf),
    log,
    logTotal,
    rule,
    drift: drift && !options.showClasses ? { ...drift, differences: drift.differences.map((d) => ({ ...d, classId: null })) } : drift,
  };
}
