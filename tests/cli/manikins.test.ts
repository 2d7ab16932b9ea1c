// `quarterbeat manikins --json` on the demo network: every manikin with a paired class, and the one whose
// depth sensor the demo made drift flagged for a check.
import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEMO_SCENARIO } from "../../server/demo/scenario";
import { cli } from "../helpers/cli";
import { tempDbFile } from "../helpers/testApp";

const db = tempDbFile("qb-cli-manikins");
beforeAll(() => {
  const seeded = cli(["--db", db, "demo", "seed"]);
  expect(seeded.code, seeded.stderr).toBe(0);
}, 180_000);
afterAll(() => fs.rmSync(path.dirname(db), { recursive: true, force: true }));

describe("quarterbeat manikins", () => {
  it("answers one row per manikin with its offset, interval and flag, flagging the drifting manikin", () => {
    const res = cli(["--db", db, "manikins", "--from", "2026-Q1", "--to", "2026-Q4", "--json"]);
    expect(res.stderr).toBe("");
    expect(res.code).toBe(0);
    const rows = JSON.parse(res.stdout) as Record<string, unknown>[];
    expect(rows.length).toBeGreaterThan(30);
    for (const row of rows) {
      expect(Object.keys(row).sort()).toEqual(["ci95", "classes", "flag", "flagged_in_round", "manikin", "offset_mm", "profile", "se_mm", "site"]);
      expect(["check", "ok", "too few classes"]).toContain(row.flag);
      expect(row.classes).toBeGreaterThanOrEqual(1);
    }
    expect(rows.filter((r) => r.flag === "check").map((r) => r.manikin)).toEqual([DEMO_SCENARIO.driftingSensor.manikin]);
  });

  it("narrows to one site and takes the rule's settings", () => {
    const res = cli(["--db", db, "manikins", "--from", "2026-Q1", "--to", "2026-Q4", "--site", "LTQ", "--min-offset", "10", "--json"]);
    expect(res.code).toBe(0);
    const rows = JSON.parse(res.stdout) as { manikin: string; site: string; flag: string }[];
    expect(rows.length).toBeGreaterThan(0);
    expect(rows.every((r) => r.site === "LTQ" && r.manikin.startsWith("LTQ-"))).toBe(true);
    expect(rows.filter((r) => r.flag === "check")).toEqual([]);
  });

  it("prints the rule and the flagged manikin as text", () => {
    const res = cli(["--db", db, "manikins", "--from", "2026-Q1", "--to", "2026-Q4"]);
    expect(res.code).toBe(0);
    expect(res.stdout).toMatch(/Flagged when at least 5 paired classes, \|offset\| ≥ 3 mm/);
    expect(res.stdout).toMatch(new RegExp(`${DEMO_SCENARIO.driftingSensor.manikin}\\s+adult.*CHECK`));
  });

  it("refuses a bad quarter, an unknown site and a bad setting with exit 2", () => {
    const badQuarter = cli(["--db", db, "manikins", "--from", "2026-Q5", "--to", "2026-Q4"]);
    expect(badQuarter.code).toBe(2);
    expect(badQuarter.stderr).toMatch(/"2026-Q5" is not a quarter/);
    const badSite = cli(["--db", db, "manikins", "--from", "2026-Q1", "--to", "2026-Q4", "--site", "NOPE"]);
    expect(badSite.code).toBe(2);
    expect(badSite.stderr).toMatch(/No site has the code "NOPE"/);
    const badSetting = cli(["--db", db, "manikins", "--from", "2026-Q1", "--to", "2026-Q4", "--min-classes", "2.5"]);
    expect(badSetting.code).toBe(2);
    expect(badSetting.stderr).toMatch(/--min-classes 2.5 is not a whole number/);
  });
});
