// Manikin sensor drift. A manikin whose depth sensor reads wrong makes every learner on it look too deep or too
// shallow; comparing it with the other manikins of the same patient type used in the same classes separates
// the device from the people. For manikin m and each class c in which m and at least one other manikin of
// the same patient type were used, d_c = mean depth of m's attempts in c − mean depth of the other manikins'
// attempts of that patient type in c. The offset is the mean of d_c over those k classes with its 95 %
// interval (shared/stats/meanInterval.ts). A manikin meets the rule when k ≥ minClasses, |offset| ≥
// minOffsetMm and the interval excludes 0. A drifting manikin pulls its peers' offsets the other way, so
// manikins are flagged one at a time: the largest |offset| that meets the rule is flagged, its attempts leave
// every other comparison, and the rest are compared again until none meets the rule.
import { and, between, eq, inArray } from "drizzle-orm";
import type { DriftFlag } from "../../shared/schemas/equipment";
import { DEFAULT_POLICY, type EquipmentPolicy, type PatientType } from "../../shared/scoring/policy";
import { meanWithInterval } from "../../shared/stats/meanInterval";
import type { Db } from "../db/client";
import { attempts, classes, manikins, sites } from "../db/schema";

export interface DriftOptions {
  minClasses: number;
  minOffsetMm: number;
}

/** The flag rule as the network's equipment policy sets it (Settings). */
export function driftRule(policy: EquipmentPolicy): DriftOptions {
  return { minClasses: policy.driftMinClasses, minOffsetMm: policy.driftMinOffsetMm };
}

export const DRIFT_DEFAULTS: DriftOptions = driftRule(DEFAULT_POLICY.equipment);

export interface DriftAttempt {
  classId: string;
  /** The class's date, YYYY-MM-DD: orders the paired differences over time. */
  date: string;
  manikin: string;
  profile: PatientType;
  depthMm: number;
}

export interface PairedDifference {
  classId: string;
  date: string;
  /** The manikin's mean depth in the class minus its peers' (mm). */
  difference_mm: number;
  attempts: number;
  peer_attempts: number;
}

export interface ManikinDrift {
  manikin: string;
  profile: PatientType;
  /** Paired classes (k). */
  classes: number;
  offset_mm: number | null;
  se_mm: number | null;
  ci95: [number, number] | null;
  flag: DriftFlag;
  /** The comparison round that flagged the manikin (1 = all manikins compared); null when not flagged. */
  flagged_in_round: number | null;
  /** The paired differences behind the offset, oldest class first. */
  differences: PairedDifference[];
}

interface Cell {
  sum: number;
  n: number;
}

/** Depth sums per class and patient type, per manikin. */
function groupByClass(rows: readonly DriftAttempt[]) {
  const byClass = new Map<string, { classId: string; date: string; profile: PatientType; manikins: Map<string, Cell> }>();
  for (const row of rows) {
    const key = `${row.classId}|${row.profile}`;
    let group = byClass.get(key);
    if (!group) byClass.set(key, (group = { classId: row.classId, date: row.date, profile: row.profile, manikins: new Map() }));
    const cell = group.manikins.get(row.manikin) ?? { sum: 0, n: 0 };
    cell.sum += row.depthMm;
    cell.n += 1;
    group.manikins.set(row.manikin, cell);
  }
  return [...byClass.values()].sort((a, b) => a.date.localeCompare(b.date) || a.classId.localeCompare(b.classId));
}

type ClassGroups = ReturnType<typeof groupByClass>;

/** One round: every manikin not yet flagged against its peers, leaving out the flagged manikins' attempts. */
function compareRound(groups: ClassGroups, flagged: ReadonlySet<string>, options: DriftOptions): Map<string, Omit<ManikinDrift, "flagged_in_round">> {
  const differences = new Map<string, { manikin: string; profile: PatientType; list: PairedDifference[] }>();
  for (const group of groups) {
    const present = [...group.manikins].filter(([manikin]) => !flagged.has(manikin));
    if (present.length < 2) continue;
    const total = present.reduce((t, [, c]) => ({ sum: t.sum + c.sum, n: t.n + c.n }), { sum: 0, n: 0 });
    for (const [manikin, cell] of present) {
      const peers = { sum: total.sum - cell.sum, n: total.n - cell.n };
      const key = `${manikin}|${group.profile}`;
      const entry = differences.get(key) ?? { manikin, profile: group.profile, list: [] };
      entry.list.push({
        classId: group.classId,
        date: group.date,
        difference_mm: cell.sum / cell.n - peers.sum / peers.n,
        attempts: cell.n,
        peer_attempts: peers.n,
      });
      differences.set(key, entry);
    }
  }
  const results = new Map<string, Omit<ManikinDrift, "flagged_in_round">>();
  for (const [key, { manikin, profile, list }] of differences) {
    const { mean, se, ci95 } = meanWithInterval(list.map((d) => d.difference_mm));
    const k = list.length;
    const meetsRule = k >= options.minClasses && mean !== null && Math.abs(mean) >= options.minOffsetMm && ci95 !== null && (ci95[0] > 0 || ci95[1] < 0);
    results.set(key, {
      manikin,
      profile,
      classes: k,
      offset_mm: mean,
      se_mm: se,
      ci95,
      flag: k < options.minClasses ? "too few classes" : meetsRule ? "check" : "ok",
      differences: list,
    });
  }
  return results;
}

/** Every manikin with at least one paired class, flagged manikins with the round that flagged them. */
export function manikinDrift(rows: readonly DriftAttempt[], options: DriftOptions = DRIFT_DEFAULTS): ManikinDrift[] {
  const groups = groupByClass(rows);
  const flagged = new Set<string>();
  const flaggedResults: ManikinDrift[] = [];
  for (let round = 1; ; round++) {
    const results = compareRound(groups, flagged, options);
    const candidates = [...results.values()].filter((r) => r.flag === "check");
    if (candidates.length === 0) {
      const others = [...results.values()].map((r) => ({ ...r, flagged_in_round: null }));
      return [...flaggedResults, ...others].sort((a, b) => a.manikin.localeCompare(b.manikin) || a.profile.localeCompare(b.profile));
    }
    const worst = candidates.reduce((a, b) => (Math.abs(b.offset_mm!) > Math.abs(a.offset_mm!) ? b : a));
    flaggedResults.push({ ...worst, flagged_in_round: round });
    flagged.add(worst.manikin);
  }
}

export interface DriftQuery {
  from: string;
  to: string;
  /** One site's manikins; null for the whole fleet. */
  siteId: number | null;
  options?: DriftOptions;
}

/**
 * Reads the depth of each attempt on the chosen manikins in the period (through attempts_manikin_idx:
 * manikin, quarter) — a per-device comparison within classes, which no network summary holds.
 */
export function readDriftAttempts(db: Db, query: Omit<DriftQuery, "options">): DriftAttempt[] {
  const fleet = db
    .select({ id: manikins.id })
    .from(manikins)
    .where(query.siteId === null ? undefined : eq(manikins.siteId, query.siteId))
    .all()
    .map((m) => m.id);
  if (fleet.length === 0) return [];
  return db
    .select({ classId: attempts.classId, date: classes.date, manikin: manikins.assetId, profile: attempts.profile, depthMm: attempts.depthMm })
    .from(attempts)
    .innerJoin(classes, eq(classes.id, attempts.classId))
    .innerJoin(manikins, eq(manikins.id, attempts.manikinId))
    .where(and(inArray(attempts.manikinId, fleet), between(attempts.quarter, query.from, query.to)))
    .all();
}

export interface ManikinDriftWithSite extends ManikinDrift {
  site: string | null;
}

/** The drift comparison for a site's manikins (or the fleet's) over a period of quarters. */
export function manikinDriftReport(db: Db, query: DriftQuery): ManikinDriftWithSite[] {
  const rows = readDriftAttempts(db, query);
  const siteOf = new Map(
    db
      .select({ assetId: manikins.assetId, site: sites.code })
      .from(manikins)
      .leftJoin(sites, eq(sites.id, manikins.siteId))
      .all()
      .map((m) => [m.assetId, m.site]),
  );
  return manikinDrift(rows, query.options ?? DRIFT_DEFAULTS).map((r) => ({ ...r, site: siteOf.get(r.manikin) ?? null }));
}
