// Turns a stroke plan into the compressions a manikin would record: time since start, peak depth and the
// residual depth at the top of the following recoil. Rate wanders and drifts, depth is noisy and fades with
// fatigue, pauses of several seconds interrupt the rhythm, leaners leave the chest partly compressed.
// Values are rounded as a manikin export would write them (whole ms, tenths of a millimetre).
import type { StrokePlan } from "./performance";
import type { Random } from "./random";

export interface CompressionStream {
  t: Float64Array;
  depth: Float64Array;
  release: Float64Array;
}

const SHORTEST_INTERVAL_MS = 300; // 200 per minute: faster is not a compression any hand makes
const LONGEST_INTERVAL_MS = 1500; // slower is a hesitation, which the plan's pauses model separately

export function simulateStream(plan: StrokePlan, random: Random): CompressionStream {
  const n = plan.compressions;
  const t = new Float64Array(n);
  const depth = new Float64Array(n);
  const release = new Float64Array(n);

  // Pauses (in ms) fall before randomly chosen compressions, never the first; 0 = no pause.
  const pauseBefore = new Float64Array(n);
  for (const seconds of plan.pauseSeconds) {
    let at = random.int(5, n - 5);
    while (pauseBefore[at] > 0) at = at + 1 < n ? at + 1 : 1;
    pauseBefore[at] = Math.round(seconds * 1000);
  }

  let time = random.int(300, 1500); // from pressing start to the first compression
  let rateWander = 0; // slow drift of the learner's rhythm, in per minute
  let depthWander = 0; // slow drift of the learner's depth, in mm
  for (let i = 0; i < n; i++) {
    const progress = n > 1 ? i / (n - 1) : 0;
    if (i > 0) {
      if (pauseBefore[i] > 0) {
        time += pauseBefore[i];
      } else {
        rateWander = 0.9 * rateWander + random.uniform(-2, 2); // uniform steps are cheaper and just as plausible
        const rate = Math.max(40, plan.rateCpm + plan.rateDriftCpm * progress + rateWander);
        const interval = (60000 / rate) * (1 + random.normal(0, plan.intervalJitter));
        time += Math.round(Math.min(LONGEST_INTERVAL_MS, Math.max(SHORTEST_INTERVAL_MS, interval)));
      }
    }
    t[i] = time;

    depthWander = 0.85 * depthWander + random.uniform(-1.4, 1.4);
    const peak = plan.depthMeanMm - plan.fatigueMm * progress + depthWander + random.normal(0, plan.depthNoiseMm);
    depth[i] = roundTenth(Math.min(90, Math.max(5, peak)));

    const leaning = plan.leanMm > 0 && random.chance(plan.leanShare);
    const residual = leaning ? random.normal(plan.leanMm, 1.2) : Math.abs(random.normal(0, 1.1));
    release[i] = roundTenth(Math.min(depth[i] - 1, Math.max(0, residual)));
  }
  return { t, depth, release };
}

function roundTenth(value: number): number {
  return Math.round(value * 10) / 10;
}
