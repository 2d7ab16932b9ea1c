// The signals worth telling after an import: instructors whose measured pass rate in the newest quarter lies
// outside the funnel's 99.8 % limits around the network rate (the same positions as the Instructors page),
// manikins due for service by the network's equipment policy (the same judgement as the Equipment page),
// manikins whose depth readings differ from their peers' over the newest four quarters with data (the drift
// rule of the Equipment page, with the network's thresholds), shifts in the monthly pass rate of the network
// or a site (./shiftSignals.ts) and active sites with no data in the newest quarter (./noDataSignals.ts). Each
// signal carries a key that stays the same while it holds. Who receives which is ./audience.ts.
import { periodOf, quarterOf } from "../../shared/period";
import { equipmentReport } from "../equipment/service";
import { instructorTable } from "../insight/instructors";
import { quartersWithData } from "../insight/quarters";
import type { ResolvedFilters } from "../insight/filters";
import { driftRule, manikinDriftReport } from "../metrics/manikinDrift";
import { currentPolicy } from "../policy/service";
import type { Db } from "../db/client";
import { noDataSignals, type NoDataSignal } from "./noDataSignals";
import { shiftSignals, type ShiftSignal } from "./shiftSignals";

export type { NoDataSignal, ShiftSignal };

export interface FunnelSignal {
  key: string;
  quarter: string;
  /** Only the code: the digest names no person. */
  instructorCode: string;
  /** For the link to the instructor's page; never written into a message. */
  instructorId: number;
  siteCode: string | null;
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
  shift: ShiftSignal[];
  service: ServiceSignal[];
  drift: DriftSignal[];
  noData: NoDataSignal[];
}

export const noSignals = (): Signals => ({ funnel: [], shift: [], service: [], drift: [], noData: [] });

export type TaggedSignal =
  | { kind: "funnel"; signal: FunnelSignal }
  | { kind: "shift"; signal: ShiftSignal }
  | { kind: "service"; signal: ServiceSignal }
  | { kind: "drift"; signal: DriftSignal }
  | { kind: "noData"; signal: NoDataSignal };

/** Every signal with its kind, in the order the digest lists them. */
export function signalList(signals: Signals): TaggedSignal[] {
  return [
    ...signals.funnel.map((signal) => ({ kind: "funnel" as const, signal })),
    ...signals.shift.map((signal) => ({ kind: "shift" as const, signal })),
    ...signals.service.map((signal) => ({ kind: "service" as const, signal })),
    ...signals.drift.map((signal) => ({ kind: "drift" as const, signal })),
    ...signals.noData.map((signal) => ({ kind: "noData" as const, signal })),
  ];
}

/** The signals of a list, back in their sections. */
export function signalsOf(list: readonly TaggedSignal[]): Signals {
  const signals = noSignals();
  for (const item of list) (signals[item.kind] as TaggedSignal["signal"][]).push(item.signal);
  return signals;
}

/** Every signal's key, in the order the digest lists them. */
export function signalKeys(signals: Signals): string[] {
  return signalList(signals).map(({ signal }) => signal.key);
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
    return [
      {
        key: `funnel:${quarter}:${row.code}:${side}`,
        quarter,
        instructorCode: row.code,
        instructorId: row.id,
        siteCode: row.site?.code ?? null,
        side,
        passed: row.passRate.successes ?? 0,
        attempts: row.attempts,
      },
    ];
  });
  const policy = currentPolicy(db).policy.equipment;
  const equipment = equipmentReport(db, policy, { filters: wholeNetwork(quarter), onlyInstructorId: null, asOf });
  const lastService = new Map(equipment.fleet.map((m) => [m.id, m.lastServiceDate]));
  const service = equipment.attention.flatMap((item): ServiceSignal[] => {
    if ((item.kind !== "service_by_compressions" && item.kind !== "service_by_days") || !item.manikin) return [];
    // a new service starts a new interval, and with it a new signal once that one runs out
    const since = lastService.get(item.manikin.id) ?? "never";
    return [
      { key: `service:${item.manikin.assetId}:${item.kind}:${since}`, assetId: item.manikin.assetId, siteCode: item.site?.code ?? null, reason: item.reason },
    ];
  });
  return {
    funnel,
    shift: shiftSignals(db, withData),
    service,
    drift: driftSignals(db, withData.slice(0, DRIFT_WINDOW_QUARTERS), driftRule(policy)),
    noData: noDataSignals(db),
  };
}

/** `quarters`: newest first. A manikin is signalled once per direction of its offset. */
function driftSignals(db: Db, quarters: readonly string[], rule: ReturnType<typeof driftRule>): DriftSignal[] {
  if (quarters.length === 0) return [];
  const from = quarters[quarters.length - 1];
  const to = quarters[0];
  return manikinDriftReport(db, { from, to, siteId: null, options: rule }).flatMap((m): DriftSignal[] => {
    if (m.flag !== "check" || m.offset_mm === null || m.ci95 === null) return [];
    const direction = m.offset_mm > 0 ? "deeper" : "shallower";
    return [
      { key: `drift:${m.manikin}:${direction}`, assetId: m.manikin, siteCode: m.site, from, to, classes: m.classes, offsetMm: m.offset_mm, ci95: m.ci95 },
    ];
  });
}
