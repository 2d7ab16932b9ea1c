// The pass rule of shared/scoring/scoreAttempt.ts as a list of its criteria, each with the attempt's value, the
// threshold, the margin and, for a missed criterion, the error it gives — so a page can show every criterion
// with the numbers that decided it. A test holds the missed criteria equal to scoreAttempt's errors.
import type { PassRule } from "./policy";
import type { AttemptError, ScoringInput } from "./scoreAttempt";

export type CriterionKey = "depth" | "rate" | "recoil" | "handsOn" | "longestPause";

export interface PassCriterion {
  key: CriterionKey;
  /** The attempt's value as recorded: a percentage 0–100, or seconds for the longest pause. */
  value: number;
  threshold: number;
  /** "atLeast": met when value ≥ threshold; "atMost": met when value ≤ threshold. */
  comparison: "atLeast" | "atMost";
  met: boolean;
  /** value − threshold: positive is above the threshold, whichever way the rule points. */
  margin: number;
  /** The error a miss gives (for a share, the way most of the missing compressions went); null when met. */
  error: AttemptError | null;
  /** For a share of compressions: the shares that missed one way and the other. */
  split: { low: number; high: number } | null;
}

function share(
  key: CriterionKey,
  value: number,
  threshold: number,
  split: { low: number; high: number } | null,
  errors: [AttemptError, AttemptError],
): PassCriterion {
  const met = value >= threshold;
  // ties go to the first way, as scoreAttempt decides them
  const error = met ? null : split === null || split.low >= split.high ? errors[0] : errors[1];
  return { key, value, threshold, comparison: "atLeast", met, margin: value - threshold, error, split };
}

export function passRuleCriteria(metrics: ScoringInput, rule: PassRule): PassCriterion[] {
  const pauseMet = metrics.longest_pause_s <= rule.maxLongestPauseS;
  return [
    share("depth", metrics.depth_ok_pct, rule.minDepthOkPct, { low: metrics.too_shallow_pct, high: metrics.too_deep_pct }, ["too_shallow", "too_deep"]),
    share("rate", metrics.rate_ok_pct, rule.minRateOkPct, { low: metrics.too_slow_pct, high: metrics.too_fast_pct }, ["too_slow", "too_fast"]),
    share("recoil", metrics.recoil_ok_pct, rule.minRecoilOkPct, null, ["incomplete_recoil", "incomplete_recoil"]),
    share("handsOn", metrics.hands_on_pct, rule.minHandsOnPct, null, ["low_hands_on", "low_hands_on"]),
    {
      key: "longestPause",
      value: metrics.longest_pause_s,
      threshold: rule.maxLongestPauseS,
      comparison: "atMost",
      met: pauseMet,
      margin: metrics.longest_pause_s - rule.maxLongestPauseS,
      error: pauseMet ? null : "long_pause",
      split: null,
    },
  ];
}
