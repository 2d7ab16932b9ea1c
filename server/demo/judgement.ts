// What the instructor decides by watching. Instructors see rhythm and pauses but hardly depth or recoil, and
// they lean towards passing, so their results agree only modestly with the measurements (instructors judge
// depth poorly by eye: Brennan et al., CJEM 2016; Lynch et al., Resuscitation 2008).
import { DEFAULT_POLICY, type PatientType } from "../../shared/scoring/policy";
import { scoreAttempt, type AttemptError } from "../../shared/scoring/scoreAttempt";
import type { Random } from "./random";
import type { DemoScenario } from "./scenario";
import type { AttemptSummary } from "./summarize";

/** Faults an instructor can see from beside the manikin; depth and recoil they mostly cannot. */
const visibleErrors: readonly AttemptError[] = ["too_slow", "too_fast", "low_hands_on", "long_pause"];

export interface Judgement {
  /** The instructor's view, used for the class log's pass count. */
  passed: boolean;
  /** What the attempt record carries: some attempts are never marked. */
  recorded: "pass" | "fail" | "";
}

export function judgeAttempt(summary: AttemptSummary, profile: PatientType, live: boolean, scenario: DemoScenario, random: Random, lenient = false): Judgement {
  const odds = lenient ? { ...scenario.judgement, ...scenario.lenientInstructor } : scenario.judgement;
  const measured = scoreAttempt(summary, profile, DEFAULT_POLICY);
  const chanceOfPass = measured.passed
    ? odds.passWhenMeasuredPass
    : measured.errors.some((error) => visibleErrors.includes(error))
      ? odds.passWhenVisibleFaults
      : odds.passWhenOnlyUnseenFaults;
  const passed = random.chance(chanceOfPass);
  const unmarked = random.chance(live ? odds.emptyWhenLive : odds.emptyWhenHidden);
  return { passed, recorded: unmarked ? "" : passed ? "pass" : "fail" };
}
