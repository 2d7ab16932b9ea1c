// `quarterbeat trend --by month` on the demo network: the months' counts against an independent count of the
// attempts table, and the median and run-chart figures worked again here from the points.
import fs from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { cli } from "../helpers/cli";
import { tempDbFile } from "../helpers/testApp";

const db = tempDbFile("qb-cli-trend");
beforeAll(() => {
  const seeded = cli(["--db", db, "demo", "seed", "--today", "2026-12-01"]);
  expect(seeded.code, seeded.stderr).toBe(0);
}, 180_000);
afterAll(() => fs.rmSync(path.dirname(db), { recursive: true, force: true }));

interface Point {
  period: string;
  n: number;
  passed: number;
  rate: number;
}

/** Every attempt's class date and result, bucketed by month here rather than in SQL. */
function countByMonth(where: (row: { date: string; site: string; profile: string }) => boolean): Map<string, { n: number; passed: number }> {
  const sqlite = new Database(db, { readonly: true });
  const rows = sqlite
    .prepare(
      "SELECT c.date AS date, s.code AS site, a.profile AS profile, a.passed AS passed FROM attempts a JOIN classes c ON c.id = a.class_id JOIN sites s ON s.id = a.site_id",
    )
    .all() as { date: string; site: string; profile: string; passed: number }[];
  sqlite.close();
  const months = new Map<string, { n: number; passed: number }>();
  for (const row of rows.filter(where)) {
    const month = row.date.slice(0, 7);
    if (month < "2025-01" || month > "2026-12") continue;
    const tally = months.get(month) ?? { n: 0, passed: 0 };
    tally.n += 1;
    tally.passed += row.passed;
    months.set(month, tally);
  }
  return months;
}

function medianOf(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

/** Runs and crossings counted by hand over the points off the median. */
function runsAround(rates: number[], centre: number) {
  const sides = rates.filter((rate) => rate !== centre).map((rate) => Math.sign(rate - centre));
  let longest = 0;
  let run = 0;
  let crossings = 0;
  sides.forEach((side, i) => {
    run = i > 0 && side === sides[i - 1] ? run + 1 : 1;
    if (i > 0 && side !== sides[i - 1]) crossings += 1;
    longest = Math.max(longest, run);
  });
  return { useful: sides.length, longest, crossings };
}

describe("quarterbeat trend", () => {
  it("answers one point per month with attempts, counted as the attempts table counts them, and the run-chart figures", () => {
    const res = cli(["--db", db, "trend", "--from", "2025-Q1", "--to", "2026-Q4", "--by", "month", "--json"]);
    expect(res.stderr).toBe("");
    expect(res.code).toBe(0);
    const answer = JSON.parse(res.stdout) as {
      points: Point[];
      median: number;
      useful: number;
      longest_run: number;
      longest_run_limit: number;
      crossings: number;
      crossings_limit: number;
      signal: boolean;
    };
    const expected = countByMonth(() => true);
    expect(answer.points.map((p) => p.period)).toEqual([...expected.keys()].sort());
    expect(answer.points.length).toBe(23); // January 2025 to November 2026: the demo's "today" is 2026-12-01
    for (const point of answer.points) {
      expect({ n: point.n, passed: point.passed }, point.period).toEqual(expected.get(point.period));
      expect(point.rate).toBeCloseTo(point.passed / point.n, 12);
    }
    const rates = answer.points.map((p) => p.rate);
    expect(answer.median).toBeCloseTo(medianOf(rates), 12);
    const runs = runsAround(rates, answer.median);
    expect(answer).toMatchObject({ useful: runs.useful, longest_run: runs.longest, crossings: runs.crossings });
    // Anhøj & Olesen 2014 (PLoS One 9:e113825): longest run limit round(log2(n) + 3); for n = 23, round(7.52) = 8
    expect(answer.longest_run_limit).toBe(Math.round(Math.log2(runs.useful) + 3));
    // 5th percentile of Binomial(n − 1, 0.5), worked by hand from the binomial coefficients: 22 useful points
    // (21 trials) P(X ≤ 6) = 82160 / 2^21 = 0.039, P(X ≤ 7) = 198440 / 2^21 = 0.095 → 7; 23 useful points
    // (22 trials) P(X ≤ 6) = 110056 / 2^22 = 0.026, P(X ≤ 7) = 280600 / 2^22 = 0.067 → 7
    if (runs.useful === 22 || runs.useful === 23) expect(answer.crossings_limit).toBe(7);
    expect(answer.signal).toBe(answer.longest_run > answer.longest_run_limit || answer.crossings < answer.crossings_limit);
  });

  it("takes the median over the baseline months and narrows to a site and a patient type", () => {
    const res = cli(["--db", db, "trend", "--from", "2025-Q1", "--to", "2026-Q4", "--site", "WRM", "--profile", "adult", "--baseline-to", "2025-Q4", "--json"]);
    expect(res.code, res.stderr).toBe(0);
    const answer = JSON.parse(res.stdout) as { points: Point[]; median: number; useful: number; longest_run: number; crossings: number };
    const expected = countByMonth((row) => row.site === "WRM" && row.profile === "adult");
    expect(answer.points.map((p) => [p.period, p.n, p.passed])).toEqual([...expected.entries()].sort().map(([month, t]) => [month, t.n, t.passed]));
    const baseline = answer.points.filter((p) => p.period <= "2025-12").map((p) => p.rate);
    expect(baseline.length).toBeGreaterThan(6);
    expect(answer.median).toBeCloseTo(medianOf(baseline), 12);
    const runs = runsAround(
      answer.points.map((p) => p.rate),
      answer.median,
    );
    expect(answer).toMatchObject({ useful: runs.useful, longest_run: runs.longest, crossings: runs.crossings });
  });

  it("prints a table without --json", () => {
    const res = cli(["--db", db, "trend", "--from", "2026-Q1", "--to", "2026-Q4"]);
    expect(res.code, res.stderr).toBe(0);
    expect(res.stdout).toMatch(/^Measured pass rate by month, 2026-Q1 to 2026-Q4 \(whole network · every patient type\)/);
    expect(res.stdout).toMatch(/ {2}2026-01 +\d+ attempts · +\d+ passed · +\d+\.\d % · (above|below|on the median)/);
    expect(res.stdout).toMatch(/longest run \d+ \(a shift needs more than \d+\) · crossings \d+ \(a shift needs fewer than \d+\)/);
  });

  it("refuses bad arguments with one clear line and exit 2", () => {
    const cases: [string[], RegExp][] = [
      [["--by", "week"], /--by week is not supported/],
      [["--profile", "toddler"], /--profile toddler is not a patient type/],
      [["--site", "NOPE"], /No site has the code "NOPE"/],
      [["--baseline-to", "2027-Q1"], /--baseline-to 2027-Q1 lies outside 2025-Q1 to 2026-Q4/],
      [["--baseline-to", "soon"], /--baseline-to "soon" is not a quarter/],
    ];
    for (const [extra, message] of cases) {
      const res = cli(["--db", db, "trend", "--from", "2025-Q1", "--to", "2026-Q4", ...extra]);
      expect(res.code, extra.join(" ")).toBe(2);
      expect(res.stderr.split("\n")[0]).toMatch(message);
    }
    const backwards = cli(["--db", db, "trend", "--from", "2026-Q4", "--to", "2025-Q1"]);
    expect(backwards.code).toBe(2);
    expect(backwards.stderr).toMatch(/--from 2026-Q4 comes after --to 2025-Q1/);
  });
});
