// What the instructor decides by watching. Instructors see rhythm and pauses but hardly depth or recoil, and
// they lean towards passing, so their results agree only modestly with the measurements (instructors judge
// depth poorly by eye: Brennan et al., CJEM 2016; Lynch et al., Resuscitation 2008).
import { DEFAULT_POLICY } from "../../shared/scoring/policy";
import type { Random } from "./random";
import type { DemoScenario } from "./scenario";
import { meetsPassRule, type AttemptSummary } from "./summarize";

export interface Judgement {
  /** The instructor's view, used for the class log's pass count. */
  passed: boolean;
  /** What the attempt record carries: some attempts are never marked. */
  recorded: "pass" | "fail" | "";
}

export function judgeAttempt(
  summary: AttemptSummary,
  live: boolean,
  scenario: DemoScenario,
  random: Random,
): Judgement {
  const rule = DEFAULT_POLICY.passRule;
  const odds = scenario.judgement;
  let chanceOfPass: number;
  if (meetsPassRule(summary, rule)) {
    chanceOfPass = odds.passWhenMeasuredPass;
  } else {
    const visibleFault =
      summary.rate_ok_pct < rule.minRateOkPct ||
      summary.hands_on_pct < rule.minHandsOnPct ||
      summary.longest_pause_s > rule.maxLongestPauseS;
    chanceOfPass = visibleFault ? odds.passWhenVisibleFaults : odds.passWhenOnlyUnseenFaults;
  }
  const passed = random.chance(chanceOfPass);
  const unmarked = random.chance(live ? odds.emptyWhenLive : odds.emptyWhenHidden);
  return { passed, recorded: unmarked ? "" : passed ? "pass" : "fail" };
}
