// The packed form of one instructor's distributions in one quarter (instructor_values' packed columns, one per
// metric): for each patient type × feedback display taught, the ascending (value, count) pairs of the values as
// recorded. All numbers are float64, so values come back to the last bit and counts exactly.
//
//   section = [stratum, metric, pairs, value₁, count₁, …, valueₙ, countₙ]   (sections in stratum order)
//
// Sections are read as views on the blob, with no copy of the pairs.
import { feedbackModes, type FeedbackMode } from "../../shared/domain";
import { patientTypes, type PatientType } from "../../shared/scoring/policy";
import { summaryMetrics } from "../db/schema";

export type SummaryMetric = (typeof summaryMetrics)[number];

/** The column of each metric's packed pairs (in instructor_values and instructor_running_values), in summaryMetrics order. */
export const PACKED_COLUMNS = summaryMetrics.map((metric) => `packed_${metric}`);

/** Ascending (value, count) pairs, interleaved: [v₁, c₁, v₂, c₂, …]. */
export type Pairs = Float64Array;

/** A patient type × feedback display, numbered profile-major. */
export type StratumIndex = number;

export function stratumIndexOf(profile: string, feedback: string): StratumIndex {
  return patientTypes.indexOf(profile as PatientType) * feedbackModes.length + feedbackModes.indexOf(feedback as FeedbackMode);
}

/** Every stratum's patient type and feedback display, by index (looked up, not built, in loops over every row). */
export const STRATA: readonly { profile: PatientType; feedback: FeedbackMode }[] = patientTypes.flatMap((profile) =>
  feedbackModes.map((feedback) => ({ profile, feedback })),
);

export function stratumOf(index: StratumIndex): { profile: PatientType; feedback: FeedbackMode } {
  return STRATA[index];
}

/** Builds the pairs of one stratum and metric from its values in any order. */
export function pairsOf(values: readonly number[]): Pairs {
  const sorted = Float64Array.from(values).sort();
  const pairs = new Float64Array(sorted.length * 2);
  let k = 0;
  for (let i = 0; i < sorted.length; i++) {
    if (k > 0 && pairs[k - 2] === sorted[i]) pairs[k - 1] += 1;
    else {
      pairs[k++] = sorted[i];
      pairs[k++] = 1;
    }
  }
  return pairs.subarray(0, k);
}

/** Packs the sections of one metric (its index in summaryMetrics) given as stratum → metric index → pairs. */
export function pack(strata: ReadonlyMap<StratumIndex, readonly Pairs[]>, metric: number): Buffer {
  return packSections(new Map([...strata].map(([stratum, byMetric]) => [stratum, byMetric[metric]])), metric);
}

/** Packs one metric's pairs given per stratum. */
export function packSections(strata: ReadonlyMap<StratumIndex, Pairs>, metric: number): Buffer {
  let length = 0;
  for (const pairs of strata.values()) length += 3 + pairs.length;
  const out = new Float64Array(length);
  let at = 0;
  for (const stratum of [...strata.keys()].sort((a, b) => a - b)) {
    const pairs = strata.get(stratum)!;
    out[at++] = stratum;
    out[at++] = metric;
    out[at++] = pairs.length / 2;
    out.set(pairs, at);
    at += pairs.length;
  }
  return Buffer.from(out.buffer, out.byteOffset, out.byteLength);
}

/** The sections of a packed row by stratum (views on the blob). */
export function sectionsOf(packed: Uint8Array): Map<StratumIndex, Pairs> {
  const sections = new Map<StratumIndex, Pairs>();
  forEachSection(packed, (stratum, _metric, pairs) => sections.set(stratum, pairs));
  return sections;
}

/** The blob's numbers; a Float64Array view needs an 8-byte aligned offset, which small blobs from Node's buffer pool may lack. */
function float64View(packed: Uint8Array): Float64Array {
  const aligned = packed.byteOffset % 8 === 0 ? packed : new Uint8Array(packed); // a copy at offset 0
  return new Float64Array(aligned.buffer, aligned.byteOffset, aligned.byteLength / 8);
}

/** Calls `visit` with each section of a packed row. */
export function forEachSection(packed: Uint8Array, visit: (stratum: StratumIndex, metric: number, pairs: Pairs) => void): void {
  const numbers = float64View(packed);
  let at = 0;
  while (at < numbers.length) {
    const stratum = numbers[at];
    const metric = numbers[at + 1];
    const end = at + 3 + 2 * numbers[at + 2];
    visit(stratum, metric, numbers.subarray(at + 3, end));
    at = end;
  }
}

/** Merges ascending pairs into one ascending list, adding the counts of equal values (one pass, one allocation). */
export function mergePairs(lists: readonly Pairs[]): Pairs {
  if (lists.length === 0) return new Float64Array(0);
  if (lists.length === 1) return lists[0];
  if (lists.length > 8) {
    // many lists (a whole network's instructor-quarters): merge halves first, so each pass scans few heads
    const half = Math.ceil(lists.length / 2);
    return mergePairs([mergePairs(lists.slice(0, half)), mergePairs(lists.slice(half))]);
  }
  let length = 0;
  for (const list of lists) length += list.length;
  const out = new Float64Array(length);
  const at = new Array<number>(lists.length).fill(0);
  let k = 0;
  for (;;) {
    // the smallest value at the head of any list (a handful of lists: a scan beats a heap)
    let smallest = Infinity;
    let found = false;
    for (let l = 0; l < lists.length; l++) {
      if (at[l] < lists[l].length && lists[l][at[l]] <= smallest) {
        smallest = lists[l][at[l]];
        found = true;
      }
    }
    if (!found) break;
    let count = 0;
    for (let l = 0; l < lists.length; l++) {
      if (at[l] < lists[l].length && lists[l][at[l]] === smallest) {
        count += lists[l][at[l] + 1];
        at[l] += 2;
      }
    }
    out[k++] = smallest;
    out[k++] = count;
  }
  return out.subarray(0, k);
}

/**
 * The pairs of `whole` less those of `part`, a sub-multiset of it (a running total less an earlier one): counts
 * are subtracted, values left with none are dropped. Exact, as counts are whole numbers.
 */
export function subtractPairs(whole: Pairs, part: Pairs): Pairs {
  if (part.length === 0) return whole;
  const out = new Float64Array(whole.length);
  let k = 0;
  let j = 0;
  for (let i = 0; i < whole.length; i += 2) {
    let count = whole[i + 1];
    if (j < part.length && part[j] === whole[i]) {
      count -= part[j + 1];
      j += 2;
    }
    if (count < 0) throw new Error("subtractPairs: the part holds more of a value than the whole");
    if (count > 0) {
      out[k++] = whole[i];
      out[k++] = count;
    }
  }
  if (j < part.length) throw new Error("subtractPairs: the part holds a value the whole lacks");
  return out.subarray(0, k);
}

/** How many values the pairs hold. */
export function sizeOfPairs(pairs: Pairs): number {
  let n = 0;
  for (let i = 1; i < pairs.length; i += 2) n += pairs[i];
  return n;
}

/**
 * Type-7 quantile of pairs (Hyndman & Fan 1996; shared/stats `quantile` on the expanded values): ranks every
 * instructor without building (value, count) objects.
 */
export function quantileOfPairs(pairs: Pairs, p: number): number | null {
  const n = sizeOfPairs(pairs);
  if (n === 0) return null;
  const h = (n - 1) * p;
  const lowerIndex = Math.floor(h);
  const upperIndex = Math.ceil(h);
  let lower: number | null = null;
  let upper: number | null = null;
  let seen = 0;
  for (let i = 0; i < pairs.length; i += 2) {
    seen += pairs[i + 1];
    if (lower === null && seen > lowerIndex) lower = pairs[i];
    if (seen > upperIndex) {
      upper = pairs[i];
      break;
    }
  }
  // written as shared/stats interpolates (lower + fraction · (upper − lower)), so both give the same last bit
  return lower! + (h - lowerIndex) * (upper! - lower!);
}

/** Share of the values at or above `x`; null when there are none. */
export function shareAtLeast(pairs: Pairs, x: number): number | null {
  const n = sizeOfPairs(pairs);
  if (n === 0) return null;
  let atLeast = 0;
  for (let i = 0; i < pairs.length; i += 2) if (pairs[i] >= x) atLeast += pairs[i + 1];
  return atLeast / n;
}

/**
 * An instructor-quarter's tallies per stratum, packed: [stratum, n, passed, pp, pf, fp, ff, with errors,
 * compressions, one count per attempt error in attemptErrorNames order] for each stratum.
 */
export const TALLY_FIELDS = 15;

export function packTallies(strata: ReadonlyMap<StratumIndex, Float64Array>): Buffer {
  const out = new Float64Array(strata.size * (1 + TALLY_FIELDS));
  let at = 0;
  for (const stratum of [...strata.keys()].sort((a, b) => a - b)) {
    out[at] = stratum;
    out.set(strata.get(stratum)!, at + 1);
    at += 1 + TALLY_FIELDS;
  }
  return Buffer.from(out.buffer, out.byteOffset, out.byteLength);
}

/** Calls `visit` with each stratum's tally fields of a packed row. */
export function forEachTally(packed: Uint8Array, visit: (stratum: StratumIndex, fields: Float64Array) => void): void {
  const numbers = float64View(packed);
  for (let at = 0; at < numbers.length; at += 1 + TALLY_FIELDS) visit(numbers[at], numbers.subarray(at + 1, at + 1 + TALLY_FIELDS));
}

/** An instructor-quarter's attempts and judged attempts (those with an instructor's result) in one cell of the release grid. */
export interface GridCount {
  siteId: number;
  stratum: StratumIndex;
  /** 0 for attempts without a manikin. */
  manikinId: number;
  n: number;
  judged: number;
}

const CELL_FIELDS = 5;

/** Packs grid cells as [site, stratum, manikin, attempts, judged] each. */
export function packCells(cells: Iterable<GridCount>): Buffer {
  const list = [...cells];
  const out = new Float64Array(list.length * CELL_FIELDS);
  list.forEach(({ siteId, stratum, manikinId, n, judged }, i) => out.set([siteId, stratum, manikinId, n, judged], i * CELL_FIELDS));
  return Buffer.from(out.buffer, out.byteOffset, out.byteLength);
}

/** Calls `visit` with each grid cell of a packed row. */
export function forEachCell(packed: Uint8Array, visit: (cell: GridCount) => void): void {
  const numbers = float64View(packed);
  for (let at = 0; at < numbers.length; at += CELL_FIELDS) {
    visit({ siteId: numbers[at], stratum: numbers[at + 1], manikinId: numbers[at + 2], n: numbers[at + 3], judged: numbers[at + 4] });
  }
}
