// The signals worth telling coordinators and quality leads after an import: instructors whose measured pass
// rate in the newest quarter lies outside the funnel's 99.8 % limits around the network rate (the same
// positions as the Instructors page), manikins due for service by the network's equipment policy (the
// same judgement as the Equipment page), and manikins whose depth readings differ from their peers' over the
// newest four quarters with data (the drift rule of the Equipment page, with the network's thresholds). Each
// signal carries a key that stays the same while it holds.
import { periodOf, quarterOf } from "../../shared/period";
import { equipmentReport } from "../equipment/service";
import { instructorTable } from "../insight/instructors";
import { quartersWithData } from "../insight/quarters";
import type { ResolvedFilters } from "../insight/filters";
import { driftRule, manikinDriftReport } from "../metrics/manikinDrift";
import { currentPolicy } from "../policy/service";
import type { Db } from "../db/client";

export interface FunnelSignal {
  key: string;
  quarter: string;
  /** Only the code: the digest names no person. */
  instructorCode: string;
  side: "above" | "below";
  passed: number;
  attempts: number;
}

export interface ServiceSignal {
  key: string;
  assetId: string;
  siteCode: string | null;
  reason: string;
}

export interface DriftSignal {
  key: string;
  assetId: string;
  siteCode: string | null;
  /** The period compared, e.g. 2026-Q1 to 2026-Q4. */
  from: string;
  to: string;
  classes: number;
  offsetMm: number;
  ci95: [number, number];
}

export interface Signals {
  funnel: FunnelSignal[];
  service: ServiceSignal[];
  drift: DriftSignal[];
}

/** Every signal's key, in the order the digest lists them. */
export function signalKeys(signals: Signals): string[] {
  return [...signals.funnel, ...signals.service, ...signals.drift].map((signal) => signal.key);
}

/** Quarters compared for drift: one quarter holds too few shared classes to judge a manikin. */
const DRIFT_WINDOW_QUARTERS = 4;

function wholeNetwork(quarter: string): ResolvedFilters {
  return { period: periodOf(quarter, quarter), siteId: null, profile: null, feedback: null, instructorId: null, manikinId: null };
}

/** Every signal that holds now; `asOf` ("YYYY-MM-DD") is the day service intervals are measured to. */
export function currentSignals(db: Db, asOf: string): Signals {
  // the newest quarter with attempts; before any, manikins can still fall due
  const withData = quartersWithData(db);
  const quarter = withData[0] ?? quarterOf(asOf);
  const funnel = instructorTable(db, wholeNetwork(quarter)).instructors.flatMap((row): FunnelSignal[] => {
    if (row.position !== "above998" && row.position !== "below998") return [];
    const side = row.position === "above998" ? "above" : "below";
    return [{ key: `funnel:${quarter}:${row.code}:${side}`, quarter, instructorCode: row.code, side, passed: row.passRate.successes ?? 0, attempts: row.attempts }];
  });
  const policy = currentPolicy(db).policy.equipment;
  const equipment = equipmentReport(db, policy, { filters: wholeNetwork(quarter), onlyInstructorId: null, asOf });
  const lastService = new Map(equipment.fleet.map((m) => [m.id, m.lastServiceDate]));
  const service = equipment.attention.flatMap((item): ServiceSignal[] => {
    if ((item.kind !== "service_by_compressions" && item.kind !== "service_by_days") || !item.manikin) return [];
    // a new service starts a new interval, and with it a new signal once that one runs out
    const since = lastService.get(item.manikin.id) ?? "never";
    return [{ key: `service:${item.manikin.assetId}:${item.kind}:${since}`, assetId: item.manikin.assetId, siteCode: item.site?.code ?? null, reason: item.reason }];
  });
  return { funnel, service, drift: driftSignals(db, withData.slice(0, DRIFT_WINDOW_QUARTERS), driftRule(policy)) };
}

/** `quarters`: newest first. A manikin is signalled once per direction of its offset. */
function driftSignals(db: Db, quarters: readonly string[], rule: ReturnType<typeof driftRule>): DriftSignal[] {
  if (quarters.length === 0) return [];
  const from = quarters[quarters.length - 1];
  const to = quarters[0];
  return manikinDriftReport(db, { from, to, siteId: null, options: rule }).flatMap((m): DriftSignal[] => {
    if (m.flag !== "check" || m.offset_mm === null || m.ci95 === null) return [];
    const direction = m.offset_mm > 0 ? "deeper" : "shallower";
    return [{ key: `drift:${m.manikin}:${direction}`, assetId: m.manikin, siteCode: m.site, from, to, classes: m.classes, offsetMm: m.offset_mm, ci95: m.ci95 }];
  });
}
