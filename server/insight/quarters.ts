// Which quarters hold attempts (the arithmetic of quarters and ranges is shared/period.ts).
import type { Db } from "../db/client";
import { quartersWithAttempts } from "../metrics/summaries";
import { cached } from "./cache";

/** Quarters that have attempts, newest first (from the attempt summaries: a few hundred rows at most). */
export function quartersWithData(db: Db): string[] {
  return cached(db, "quarters", () => quartersWithAttempts(db));
}
