// `quarterbeat funnel` answers what GET /api/insight/instructors answers, from the same service, on the
// hand-worked insight fixture (tests/fixtures/insight/network.ts); its numbers are worked in
// tests/api/insight-drilldown.test.ts.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { cli } from "../helpers/cli";
import { startInsightApp, type InsightTestContext } from "../fixtures/insight/setup";

let t: InsightTestContext;
let file: string;
beforeAll(async () => {
  t = await startInsightApp();
  file = t.db.$client.name;
});
afterAll(() => t.db.$client.close());

describe("quarterbeat funnel", () => {
  it("answers the instructors page's figures as JSON, rates as fractions, adjusted for case mix by default", async () => {
    const res = cli(["--db", file, "funnel", "--quarter", "2026-Q2", "--json"]);
    expect(res.stderr).toBe("");
    expect(res.code).toBe(0);
    const answer = JSON.parse(res.stdout);
    const page = (await t.quality.get("/api/insight/instructors?quarter=2026-Q2&adjust=case-mix").expect(200)).body;
    expect(answer.adjust).toBe("case-mix");
    expect(answer.network_rate).toBeCloseTo(7 / 11, 12);
    expect(answer.phi).toBe(page.funnel.phi);
    expect(answer.overdispersed).toBe(true);
    expect(answer.instructors).toEqual(
      page.instructors.map(
        (row: { code: string; attempts: number; passRate: { successes: number }; expected: number; z: number | null; position: string }) => ({
          instructor: row.code,
          attempts: row.attempts,
          passed: row.passRate.successes,
          expected: row.expected,
          z: row.z,
          flag: row.position,
        }),
      ),
    );
    // A1: 6 passed of 10, 7 expected from 5 adult·live and 5 adult·hidden attempts (rates 0.85 and 0.55)
    expect(answer.instructors[0]).toMatchObject({ instructor: "A1", attempts: 10, passed: 6, flag: "inside" });
    expect(answer.instructors[0].expected).toBeCloseTo(7, 10);
  });

  it("compares with one stratum under --adjust none, over a range of quarters", () => {
    const res = cli(["--db", file, "funnel", "--from", "2026-Q1", "--to", "2026-Q2", "--adjust", "none", "--json"]);
    expect(res.code, res.stderr).toBe(0);
    const answer = JSON.parse(res.stdout);
    // 2026-Q1 adds D1's 263 attempts with 81 passed: 109 of 307 over the range
    expect(answer.period).toEqual({ from: "2026-Q1", to: "2026-Q2" });
    expect(answer.network_rate).toBeCloseTo(109 / 307, 12);
    const d1 = answer.instructors.find((row: { instructor: string }) => row.instructor === "D1");
    expect(d1).toMatchObject({ attempts: 283, passed: 101 });
    expect(d1.expected).toBeCloseTo((283 * 109) / 307, 10);
  });

  it("prints a table without --json", () => {
    const res = cli(["--db", file, "funnel", "--quarter", "2026-Q2", "--adjust", "none"]);
    expect(res.code).toBe(0);
    expect(res.stdout).toContain("Not adjusted (crude)".toLowerCase());
    expect(res.stdout).toMatch(/dispersion φ 5\.04 · overdispersed: limits widened by √φ = 2\.25/);
    expect(res.stdout).toMatch(/B1 +10 attempts · +2 passed · +6\.4 expected · z +-2\.87 · inside/);
  });

  it("refuses an unknown adjustment and a malformed quarter with a usage message", () => {
    const adjust = cli(["--db", file, "funnel", "--adjust", "age"]);
    expect(adjust.code).toBe(2);
    expect(adjust.stderr).toContain("--adjust age is not a way of comparing instructors");
    const quarter = cli(["--db", file, "funnel", "--quarter", "2026-5"]);
    expect(quarter.code).toBe(2);
    expect(quarter.stderr).toContain("--quarter: Use a quarter such as 2026-Q3");
  });
});
