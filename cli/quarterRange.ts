// The --from/--to quarter pair several commands take: both quarters, the earlier first.
import { isQuarter } from "../shared/period";
import { UsageError } from "./errors";

export function checkQuarterRange(from: string, to: string): void {
  for (const quarter of [from, to]) {
    if (!isQuarter(quarter)) throw new UsageError(`"${quarter}" is not a quarter.`, "Use the form 2026-Q3.");
  }
  if (from > to) throw new UsageError(`--from ${from} comes after --to ${to}.`, "Give the earlier quarter first.");
}
