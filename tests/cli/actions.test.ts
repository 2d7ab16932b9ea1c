// `quarterbeat actions list` on the demo network: the quality lead's two actions with their verdicts, as the
// Improvement actions page lists them.
import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { cli } from "../helpers/cli";
import { tempDbFile } from "../helpers/testApp";

const db = tempDbFile("qb-cli-actions");
beforeAll(() => {
  const seeded = cli(["--db", db, "demo", "seed", "--today", "2026-12-01"]);
  expect(seeded.code, seeded.stderr).toBe(0);
}, 180_000);
afterAll(() => fs.rmSync(path.dirname(db), { recursive: true, force: true }));

describe("quarterbeat actions list", () => {
  it("answers every action with its aim, scope, status, start, owner and verdict as JSON, newest start first", () => {
    const res = cli(["--db", db, "actions", "list", "--json"]);
    expect(res.stderr).toBe("");
    expect(res.code).toBe(0);
    const rows = JSON.parse(res.stdout);
    expect(rows).toEqual([
      {
        id: expect.any(Number),
        title: "Depth feedback cards on the adult manikins at Wrenmoor",
        aim: "too_shallow",
        target_pct: 10,
        scope: { site: "WRM", instructor: null, profile: "adult" },
        status: "stopped",
        start_date: "2026-05-01",
        owner: "Imogen Tarrow",
        verdict: "no clear change",
      },
      {
        id: expect.any(Number),
        title: "Refresher on depth, rate and recoil for every instructor",
        aim: "passRate",
        target_pct: 35,
        scope: { site: null, instructor: null, profile: null },
        status: "done",
        start_date: "2026-01-01",
        owner: "Imogen Tarrow",
        verdict: "up",
      },
    ]);
  });

  it("prints the list as text", () => {
    const res = cli(["--db", db, "actions", "list"]);
    expect(res.code, res.stderr).toBe(0);
    expect(res.stdout).toMatch(/^2 improvement actions, newest start first/);
    expect(res.stdout).toMatch(/Measured pass rate \(target 35 %\) · Whole network · Done · from 2026-01-01 · owner Imogen Tarrow\n +Higher after the start/);
    expect(res.stdout).toMatch(/Site WRM · Adult · Stopped · from 2026-05-01 · owner Imogen Tarrow\n +No clear change/);
  });

  it("refuses an unknown subcommand with a usage exit", () => {
    const res = cli(["--db", db, "actions", "remove"]);
    expect(res.code).toBe(2);
  });
});
