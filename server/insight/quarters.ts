// Which quarters hold attempts (the arithmetic of quarters and ranges is shared/period.ts).
import { sql } from "drizzle-orm";
import type { Db } from "../db/client";
import { attempts } from "../db/schema";
import { cached } from "./cache";

/**
 * Quarters that have attempts, newest first. Walks the quarter index one distinct value at a time (a
 * recursive skip-scan), so it costs a few index seeks however many attempts there are.
 */
export function quartersWithData(db: Db): string[] {
  return cached(db, "quarters", () =>
    db
      .all<{ quarter: string }>(
        sql`WITH RECURSIVE q(quarter) AS (
              SELECT max(${attempts.quarter}) FROM ${attempts}
              UNION ALL
              SELECT (SELECT max(${attempts.quarter}) FROM ${attempts} WHERE ${attempts.quarter} < q.quarter) FROM q
              WHERE q.quarter IS NOT NULL
            )
            SELECT quarter FROM q WHERE quarter IS NOT NULL`,
      )
      .map((row) => row.quarter),
  );
}
