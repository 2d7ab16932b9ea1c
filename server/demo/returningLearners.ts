// Learners who come back for recertification. Classes are visited in date order; each learner of a class
// may take on the code of an earlier learner whose last class lies scenario.returns.months ago. Whether they
// do depends on the gap and on how their first attempt in the new class went (scenario.returns), so the
// demo's returning learners pass their first attempt less often the longer they stayed away. Only learner
// codes change: every attempt, score and judgement stays as simulated.
import { DEFAULT_POLICY } from "../../shared/scoring/policy";
import { scoreAttempt } from "../../shared/scoring/scoreAttempt";
import type { ClassOutcome } from "./attempts";
import { parseDay } from "./calendar";
import type { Random } from "./random";
import type { DemoScenario } from "./scenario";

const DAY_MS = 86_400_000;
const DAYS_PER_MONTH = 30.4375;

function interpolate([atLow, atHigh]: [number, number], [low, high]: [number, number], months: number): number {
  return atLow + ((atHigh - atLow) * (months - low)) / (high - low);
}

export function plantReturningLearners(outcomes: ClassOutcome[], scenario: DemoScenario, random: Random): void {
  const plan = scenario.returns;
  const [fewest, most] = plan.months;
  /** Each code's last class, as a day number. */
  const lastClass = new Map<string, number>();
  const ordered = [...outcomes].sort((a, b) => a.plannedClass.date.localeCompare(b.plannedClass.date) || a.plannedClass.id.localeCompare(b.plannedClass.id));
  for (const outcome of ordered) {
    if (outcome.attempts.length === 0) continue;
    const day = parseDay(outcome.plannedClass.date) / DAY_MS;
    const firstAttempt = new Map<string, ClassOutcome["attempts"][number]>();
    for (const a of outcome.attempts) {
      const seen = firstAttempt.get(a.learner);
      if (!seen || a.startedAt < seen.startedAt || (a.startedAt === seen.startedAt && a.id < seen.id)) firstAttempt.set(a.learner, a);
    }
    const takenHere = new Set<string>();
    const newCode = new Map<string, string>();
    for (const [learner, first] of firstAttempt) {
      if (!random.chance(plan.share)) continue;
      const due = [...lastClass].filter(
        ([code, last]) => !takenHere.has(code) && (day - last) / DAYS_PER_MONTH >= fewest && (day - last) / DAYS_PER_MONTH <= most,
      );
      if (due.length === 0) continue;
      const [code, last] = random.pick(due);
      const months = (day - last) / DAYS_PER_MONTH;
      const passed = scoreAttempt(first.summary, first.profile, DEFAULT_POLICY).passed;
      if (!random.chance(interpolate(passed ? plan.keepWhenPassed : plan.keepWhenFailed, plan.months, months))) continue;
      newCode.set(learner, code);
      takenHere.add(code);
    }
    for (const a of outcome.attempts) a.learner = newCode.get(a.learner) ?? a.learner;
    for (const a of outcome.attempts) lastClass.set(a.learner, day);
  }
}
