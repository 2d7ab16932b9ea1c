// What each class used up: lungs replaced, mouthpieces cleaned, batteries replaced. The class log carries the
// totals; the equipment log carries the same work per manikin (one row per manikin, event and day), so the
// two files tell one story and neither adds to the other.
import { quarterIndex, quarterOf } from "../../shared/period";
import type { Random } from "./random";
import type { DemoScenario } from "./scenario";
import type { PlannedClass } from "./schedule";
import type { Timeline } from "./timeline";

export interface ManikinQuantity {
  manikin: string;
  quantity: number;
}

export interface ClassConsumables {
  /** False when the instructor left the three columns empty; the equipment log still has the work. */
  logged: boolean;
  lungs: ManikinQuantity[];
  mouthpieces: ManikinQuantity[];
  batteries: ManikinQuantity[];
}

export function classConsumables(plannedClass: PlannedClass, scenario: DemoScenario, timeline: Timeline, random: Random): ClassConsumables {
  const c = scenario.consumables;
  const manikins = Object.values(plannedClass.stations)
    .flat()
    .map((m) => m!.assetId);

  const lungCount = random.chance(c.lungChance) ? (random.chance(c.secondLungChance) ? 2 : 1) : 0;
  const batteryCount = random.chance(c.batteryChance) ? 1 : 0;

  const gap = c.cleaningGap;
  const inGap = plannedClass.site === gap.site && quarterIndex(quarterOf(plannedClass.date)) <= timeline.shiftQuarter(gap.untilQuarter);
  const [low, high] = inGap ? gap.perLearner : c.mouthpiecesPerLearner;
  const cleaned = Math.max(1, Math.round(plannedClass.learners * random.uniform(low, high)));

  return {
    logged: !random.chance(c.notLogged),
    lungs: oneEach(random.shuffled(manikins).slice(0, lungCount)),
    mouthpieces: spread(cleaned, manikins),
    batteries: oneEach(random.shuffled(manikins).slice(0, batteryCount)),
  };
}

export function total(items: ManikinQuantity[]): number {
  return items.reduce((sum, item) => sum + item.quantity, 0);
}

function oneEach(manikins: string[]): ManikinQuantity[] {
  return manikins.sort().map((manikin) => ({ manikin, quantity: 1 }));
}

/** Splits a count over manikins as evenly as possible (earlier manikins take the remainder). */
function spread(count: number, manikins: string[]): ManikinQuantity[] {
  const base = Math.floor(count / manikins.length);
  const extra = count % manikins.length;
  return manikins.map((manikin, i) => ({ manikin, quantity: base + (i < extra ? 1 : 0) })).filter((item) => item.quantity > 0);
}
