// A pass rate (or any proportion) with its Wilson 95 % interval, or the hidden form of one.
import type { Rate } from "../../shared/schemas/insight";
import { wilsonInterval } from "../../shared/stats";

export function rateOf(successes: number, n: number): Rate {
  const interval = wilsonInterval(successes, n);
  return {
    successes,
    n,
    rate: n === 0 ? null : successes / n,
    low: interval ? interval[0] : null,
    high: interval ? interval[1] : null,
    suppressed: false,
  };
}

export const hiddenRate: Rate = { successes: null, n: null, rate: null, low: null, high: null, suppressed: true };

/** The rate, or its hidden form when the group may not be shown. */
export function rateFor(successes: number, n: number, hidden: boolean): Rate {
  return hidden ? hiddenRate : rateOf(successes, n);
}
