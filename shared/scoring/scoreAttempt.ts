// Score and pass/fail for one attempt. The same rule applies to attempts analysed from a compression stream
// and to summaries imported from devices, so it reads only the metrics both kinds have.
import type { AttemptMetrics } from "./analyzeStream";
import { patientTypes, type NetworkPolicy, type PatientType } from "./policy";

/** Order matters: bit i of an error mask stands for attemptErrorNames[i]. Append only, never reorder. */
export const attemptErrorNames = ["too_shallow", "too_deep", "too_slow", "too_fast", "incomplete_recoil", "low_hands_on", "long_pause"] as const;
export type AttemptError = (typeof attemptErrorNames)[number];

/** What scoring reads; device summaries carry these even when they have no pause count. */
export type ScoringInput = Pick<
  AttemptMetrics,
  | "compressions"
  | "depth_ok_pct"
  | "too_shallow_pct"
  | "too_deep_pct"
  | "rate_ok_pct"
  | "too_slow_pct"
  | "too_fast_pct"
  | "recoil_ok_pct"
  | "hands_on_pct"
  | "longest_pause_s"
>;

export interface AttemptScore {
  /** Mean of the depth, rate and recoil shares on target, 0–100. */
  score: number;
  passed: boolean;
  /** One entry per failed criterion, in attemptErrorNames order. */
  errors: AttemptError[];
  /** Why the attempt could not be judged at all (too few compressions). */
  reason?: string;
}

/** Fewer compressions than this give no interval to judge rate by, so the attempt cannot pass. */
export const MIN_COMPRESSIONS_TO_PASS = 2;

export class ScoringInputError extends Error {
  readonly field: keyof ScoringInput;
  constructor(field: keyof ScoringInput, value: unknown, reason: string) {
    super(`${field} ${reason}; got ${String(value)}`);
    this.name = "ScoringInputError";
    this.field = field;
  }
}

const percentFields = [
  "depth_ok_pct",
  "too_shallow_pct",
  "too_deep_pct",
  "rate_ok_pct",
  "too_slow_pct",
  "too_fast_pct",
  "recoil_ok_pct",
  "hands_on_pct",
] as const;

/**
 * Scores an attempt under the network policy's pass rule. `profile` is the patient type the attempt was
 * performed on; the default pass rule is the same for all three, but the type is checked so an attempt with
 * an unknown profile is never scored silently.
 */
export function scoreAttempt(metrics: ScoringInput, profile: PatientType, policy: Pick<NetworkPolicy, "passRule">): AttemptScore {
  if (!patientTypes.includes(profile)) {
    throw new RangeError(`Unknown patient type ${JSON.stringify(profile)}; expected one of ${patientTypes.join(", ")}`);
  }
  checkInput(metrics);
  const rule = policy.passRule;
  const score = (metrics.depth_ok_pct + metrics.rate_ok_pct + metrics.recoil_ok_pct) / 3;

  if (metrics.compressions < MIN_COMPRESSIONS_TO_PASS) {
    return {
      score,
      passed: false,
      errors: [],
      reason: metrics.compressions === 0 ? "No compressions were recorded" : "Only one compression was recorded; at least two are needed to judge the rate",
    };
  }

  const errors: AttemptError[] = [];
  if (metrics.depth_ok_pct < rule.minDepthOkPct) {
    errors.push(metrics.too_shallow_pct >= metrics.too_deep_pct ? "too_shallow" : "too_deep");
  }
  if (metrics.rate_ok_pct < rule.minRateOkPct) {
    errors.push(metrics.too_slow_pct >= metrics.too_fast_pct ? "too_slow" : "too_fast");
  }
  if (metrics.recoil_ok_pct < rule.minRecoilOkPct) errors.push("incomplete_recoil");
  if (metrics.hands_on_pct < rule.minHandsOnPct) errors.push("low_hands_on");
  if (metrics.longest_pause_s > rule.maxLongestPauseS) errors.push("long_pause");
  return { score, passed: errors.length === 0, errors };
}

function checkInput(metrics: ScoringInput): void {
  const n = metrics.compressions;
  if (typeof n !== "number" || !Number.isInteger(n) || n < 0) {
    throw new ScoringInputError("compressions", n, "must be a whole number, 0 or more");
  }
  for (const field of percentFields) {
    const value = metrics[field];
    if (typeof value !== "number" || !(value >= 0 && value <= 100)) {
      throw new ScoringInputError(field, value, "must be a percentage from 0 to 100");
    }
  }
  const pause = metrics.longest_pause_s;
  if (typeof pause !== "number" || !Number.isFinite(pause) || pause < 0) {
    throw new ScoringInputError("longest_pause_s", pause, "must be a number of seconds, 0 or more");
  }
}

/** Errors as a bitmask (bit i = attemptErrorNames[i]) for compact storage and fast counting in SQL. */
export function errorsToMask(errors: readonly AttemptError[]): number {
  let mask = 0;
  for (const error of errors) {
    const bit = attemptErrorNames.indexOf(error);
    if (bit < 0) throw new RangeError(`Unknown attempt error ${JSON.stringify(error)}`);
    mask |= 1 << bit;
  }
  return mask;
}

export function maskToErrors(mask: number): AttemptError[] {
  if (!Number.isInteger(mask) || mask < 0 || mask >= 1 << attemptErrorNames.length) {
    throw new RangeError(`Error mask ${mask} is not a combination of the ${attemptErrorNames.length} known errors`);
  }
  return attemptErrorNames.filter((_, bit) => (mask & (1 << bit)) !== 0);
}
