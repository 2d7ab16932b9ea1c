// How a learner compresses on one attempt, from one number: skill (0 = a typical untrained learner; higher is
// better). Skill shrinks each profile's typical faults (scenario.performance.profiles): too shallow, too fast,
// leaning, pauses, uneven depth. The live display adds skill and steadies depth, since the learner can
// correct as they go.
import { DEFAULT_POLICY, type PatientType } from "../../shared/scoring/policy";
import type { Random } from "./random";
import type { DemoScenario } from "./scenario";

export interface StrokePlan {
  compressions: number;
  depthMeanMm: number;
  depthNoiseMm: number;
  fatigueMm: number;
  rateCpm: number;
  /** Change of rate from the first to the last compression (per minute; learners tend to speed up). */
  rateDriftCpm: number;
  /** Relative spread of one interval around the current rate. */
  intervalJitter: number;
  /** Residual depth when leaning (mm); 0 = the learner lets the chest recoil. */
  leanMm: number;
  /** Share of compressions on which a leaning learner actually leans. */
  leanShare: number;
  pauseSeconds: number[];
}

/** How much of a profile's typical fault is left at a given skill: 1 at skill 0, about 0.5 at skill 1.4. */
export function faultFactor(skill: number): number {
  return Math.min(2.5, Math.max(0.2, Math.exp(-0.5 * skill)));
}

export function planStrokes(profile: PatientType, skill: number, live: boolean, scenario: DemoScenario, random: Random): StrokePlan {
  const tendency = scenario.performance.profiles[profile];
  const band = DEFAULT_POLICY.bands[profile];
  const fault = faultFactor(skill);
  const bandMiddle = (band.depthMinMm + band.depthMaxMm) / 2;
  const rateMiddle = (band.rateMin + band.rateMax) / 2;

  const leaning = random.chance(Math.min(0.9, tendency.leanChance * fault));
  const pauseCount = random.poisson(scenario.performance.pausesPerAttempt * fault);
  const [pauseMin, pauseMax] = scenario.performance.pauseSeconds;
  const [fewest, most] = scenario.attempts.compressions;
  // Two uniform draws averaged: most attempts near the middle of the range, a few short or long ones.
  const compressions = Math.round(fewest + ((most - fewest) * (random.next() + random.next())) / 2);

  return {
    compressions,
    depthMeanMm: bandMiddle - tendency.depthShortfallMm * fault + random.normal(0, tendency.depthSpreadMm),
    depthNoiseMm: tendency.depthNoiseMm * (0.6 + 0.4 * fault) * (live ? 0.8 : 1),
    fatigueMm: tendency.fatigueMm * random.uniform(0.3, 1.2),
    rateCpm: rateMiddle + tendency.rateExcessCpm * fault + random.normal(0, live ? 4 : 6),
    rateDriftCpm: random.normal(3, 3) * fault,
    intervalJitter: 0.03 + 0.025 * fault,
    leanMm: leaning ? band.recoilMaxMm + random.uniform(0.5, 4) : 0,
    leanShare: leaning ? random.uniform(0.4, 0.95) : 0,
    // Squared uniform: most interruptions are short, a few run past the 10-second limit.
    pauseSeconds: Array.from({ length: pauseCount }, () => pauseMin + (pauseMax - pauseMin) * random.next() ** 2),
  };
}
