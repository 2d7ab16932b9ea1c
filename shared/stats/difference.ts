// Difference between two independent proportions with Newcombe's hybrid score interval (method 10 in
// Newcombe, Stat Med 1998;17:873–890): each rate's Wilson interval is combined into one for the difference.
// It keeps its coverage near 95 % for small groups and rates near 0 or 1, where the simple Wald interval
// does not. A change is called only when this interval excludes zero; otherwise it is "no clear change".
import { Z_95, wilsonInterval } from "./wilson";

export interface ProportionDifference {
  /** current − earlier, as a fraction (0.05 = 5 points). */
  difference: number;
  low: number;
  high: number;
}

export type ChangeVerdict = "up" | "down" | "no clear change";

/** The difference x1/n1 − x2/n2 with its 95 % interval; null when either group is empty. */
export function proportionDifference(x1: number, n1: number, x2: number, n2: number, z: number = Z_95): ProportionDifference | null {
  const first = wilsonInterval(x1, n1, z);
  const second = wilsonInterval(x2, n2, z);
  if (!first || !second) return null;
  const p1 = x1 / n1;
  const p2 = x2 / n2;
  const [l1, u1] = first;
  const [l2, u2] = second;
  const difference = p1 - p2;
  const low = difference - Math.sqrt((p1 - l1) ** 2 + (u2 - p2) ** 2);
  const high = difference + Math.sqrt((u1 - p1) ** 2 + (p2 - l2) ** 2);
  return { difference, low: Math.max(-1, low), high: Math.min(1, high) };
}

/** "up" or "down" only when the interval of the difference lies wholly on one side of zero. */
export function changeVerdict(difference: ProportionDifference): ChangeVerdict {
  if (difference.low > 0) return "up";
  if (difference.high < 0) return "down";
  return "no clear change";
}
