// The signals worth telling coordinators and quality leads after an import: instructors whose measured pass
// rate in the newest quarter lies outside the funnel's 99.8 % limits around the network rate (the same
// positions as the Instructors page), and manikins due for service by the network's equipment policy (the
// same judgement as the Equipment page). Each signal carries a key that stays the same while it holds.
import { periodOf, quarterOf } from "../../shared/period";
import { equipmentReport } from "../equipment/service";
import { instructorTable } from "../insight/instructors";
import { quartersWithData } from "../insight/quarters";
import type { ResolvedFilters } from "../insight/filters";
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

export interface Signals {
  funnel: FunnelSignal[];
  service: ServiceSignal[];
}

function wholeNetwork(quarter: string): ResolvedFilters {
  return { period: periodOf(quarter, quarter), siteId: null, profile: null, feedback: null, instructorId: null, manikinId: null };
}

/** Every signal that holds now; `asOf` ("YYYY-MM-DD") is the day service intervals are measured to. */
export function currentSignals(db: Db, asOf: string): Signals {
  // the newest quarter with attempts; before any, manikins can still fall due
  const quarter = quartersWithData(db)[0] ?? quarterOf(asOf);
  const funnel = instructorTable(db, wholeNetwork(quarter)).instructors.flatMap((row): FunnelSignal[] => {
    if (row.position !== "above998" && row.position !== "below998") return [];
    const side = row.position === "above998" ? "above" : "below";
    return [{ key: `funnel:${quarter}:${row.code}:${side}`, quarter, instructorCode: row.code, side, passed: row.passRate.successes ?? 0, attempts: row.attempts }];
  });
  const equipment = equipmentReport(db, currentPolicy(db).policy.equipment, { filters: wholeNetwork(quarter), onlyInstructorId: null, asOf });
  const lastService = new Map(equipment.fleet.map((m) => [m.id, m.lastServiceDate]));
  const service = equipment.attention.flatMap((item): ServiceSignal[] => {
    if ((item.kind !== "service_by_compressions" && item.kind !== "service_by_days") || !item.manikin) return [];
    // a new service starts a new interval, and with it a new signal once that one runs out
    const since = lastService.get(item.manikin.id) ?? "never";
    return [{ key: `service:${item.manikin.assetId}:${item.kind}:${since}`, assetId: item.manikin.assetId, siteCode: item.site?.code ?? null, reason: item.reason }];
  });
  return { funnel, service };
}
