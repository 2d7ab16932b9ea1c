// The learners of each class and their attempts. Each learner practises every patient type of the course,
// some more than once; learners at different manikins work side by side, each manikin one attempt at a
// time. The instructor's pass count for the class log comes from their own judgement of each learner's last
// attempt on every patient type.
import type { FeedbackMode } from "../../shared/domain";
import type { PatientType } from "../../shared/scoring/policy";
import type { Manikin } from "./fleet";
import { judgeAttempt } from "./judgement";
import { newLearnerCode } from "./learnerCodes";
import { planStrokes, type StrokePlan } from "./performance";
import { Random } from "./random";
import type { DemoScenario } from "./scenario";
import { profilesOfCourse, type PlannedClass } from "./schedule";
import { simulateStream } from "./simulateStream";
import { summarizeStream, type AttemptSummary } from "./summarize";
import type { Timeline } from "./timeline";

export interface AttemptRecord {
  id: string;
  classId: string;
  learner: string;
  manikin: string;
  profile: PatientType;
  feedback: FeedbackMode;
  startedAt: string;
  summary: AttemptSummary;
  instructorResult: "pass" | "fail" | "";
  /** The plan and the seed that produced the compressions, so the stream can be written out again. */
  plan: StrokePlan;
  streamSeed: number;
}

export interface ClassOutcome {
  plannedClass: PlannedClass;
  /** Learners the instructor recorded as passed. */
  passed: number;
  /** False when the class's manikin data never reached the network: the class is in the log only. */
  hasAttemptData: boolean;
  attempts: AttemptRecord[];
}

export function runClasses(classes: PlannedClass[], scenario: DemoScenario, timeline: Timeline, random: Random): ClassOutcome[] {
  const usedCodes = new Set<string>();
  let attemptNumber = 0;
  const nextAttemptId = () => `AT-${String(++attemptNumber).padStart(6, "0")}`;
  return classes.map((plannedClass) => runClass(plannedClass, scenario, timeline, random, usedCodes, nextAttemptId));
}

/** Skill the whole network gains from its refresher: a little while it runs, clearly afterwards. */
export function refresherSkill(quarter: number, scenario: DemoScenario, timeline: Timeline): number {
  const refresher = timeline.shiftQuarter(scenario.refresher.quarter);
  if (quarter < refresher) return 0;
  return quarter === refresher ? scenario.refresher.skillDuring : scenario.refresher.skillAfter;
}

function runClass(
  plannedClass: PlannedClass,
  scenario: DemoScenario,
  timeline: Timeline,
  random: Random,
  usedCodes: Set<string>,
  nextAttemptId: () => string,
): ClassOutcome {
  const perf = scenario.performance;
  const hasAttemptData = !random.chance(scenario.classes.withoutAttemptData);
  const profiles = profilesOfCourse[plannedClass.course];
  const classSkill = plannedClass.instructor.skill + refresherSkill(plannedClass.quarter, scenario, timeline);
  const lenient = plannedClass.instructor.code === scenario.lenientInstructor.code;
  const drift = scenario.driftingSensor;
  const driftFrom = timeline.shiftDate(drift.from);

  const learners = Array.from({ length: plannedClass.learners }, (_, index) => {
    const practised = profiles.filter((p) => p !== "child" || profiles.length === 1 || random.chance(0.5));
    return {
      index,
      code: newLearnerCode(usedCodes, random),
      ability: random.normal(0, perf.learnerSpread),
      // Attempts per patient type: one, sometimes a second, rarely a third.
      rounds: practised.map((profile) => ({ profile, count: attemptCount(scenario, random) })),
      lastJudgement: new Map<PatientType, boolean>(),
    };
  });

  // Each manikin keeps its own clock (seconds after midnight): one attempt at a time per manikin.
  const clocks = new Map<string, number>();
  const openingSeconds = plannedClass.startMinute * 60;
  const attempts: AttemptRecord[] = [];
  const mostRounds = Math.max(...learners.flatMap((l) => l.rounds.map((r) => r.count)));
  for (let round = 0; round < mostRounds; round++) {
    for (const learner of learners) {
      for (const { profile, count } of learner.rounds) {
        if (round >= count) continue;
        const stations = plannedClass.stations[profile] as Manikin[];
        const manikin = stations[learner.index % stations.length];
        const live = random.chance(scenario.attempts.liveFeedbackShare);
        const skill = classSkill + learner.ability + random.normal(0, perf.attemptSpread) + (live ? perf.liveFeedbackBoost : 0) + perf.practiceBoost * round;
        const plan = planStrokes(profile, skill, live, scenario, random);
        // a drifting sensor reads every compression deeper than the learner pressed; the learner is the same
        if (manikin.assetId === drift.manikin && plannedClass.date >= driftFrom) plan.depthMeanMm += drift.depthMm;
        const streamSeed = random.nextUint32();
        const summary = summarizeStream(simulateStream(plan, new Random(streamSeed)), profile);
        const judgement = judgeAttempt(summary, profile, live, scenario, random, lenient);
        learner.lastJudgement.set(profile, judgement.passed);
        if (!hasAttemptData) continue; // judged in the room, but the data never arrived

        const start = clocks.get(manikin.assetId) ?? openingSeconds + random.int(8, 20) * 60;
        clocks.set(manikin.assetId, start + Math.ceil(summary.duration_s) + random.int(45, 150));
        attempts.push({
          id: nextAttemptId(),
          classId: plannedClass.id,
          learner: learner.code,
          manikin: manikin.assetId,
          profile,
          feedback: live ? "live" : "hidden",
          startedAt: `${plannedClass.date}T${clockTime(start)}Z`,
          summary,
          instructorResult: judgement.recorded,
          plan,
          streamSeed,
        });
      }
    }
  }

  const passed = learners.filter((l) => [...l.lastJudgement.values()].every(Boolean)).length;
  return { plannedClass, passed, hasAttemptData, attempts };
}

function attemptCount(scenario: DemoScenario, random: Random): number {
  let count = 1;
  for (const chance of scenario.attempts.extraAttemptChance) {
    if (!random.chance(chance)) break;
    count++;
  }
  return count;
}

function clockTime(secondsAfterMidnight: number): string {
  const h = Math.floor(secondsAfterMidnight / 3600);
  const m = Math.floor((secondsAfterMidnight % 3600) / 60);
  const s = secondsAfterMidnight % 60;
  return [h, m, s].map((v) => String(v).padStart(2, "0")).join(":");
}
