// A bulk attempts import stages its new rows and writes them, with their summaries, in one statement each once
// the file is accepted. Its outcomes (inserted, updated, unchanged, duplicate) must be those of writing row by
// row, across and within the batches of 16 rows, and its summaries those the per-row triggers keep: checked by
// deleting every attempt (the delete triggers must then leave every summary empty) and inserting them again
// one by one outside any import (the insert triggers must then rebuild exactly what the import wrote).
import { describe, expect, it } from "vitest";
import type { Db } from "../../../server/db/client";
import { undoBatch } from "../../../server/imports/undo";
import { refreshInstructorValues } from "../../../server/metrics/instructorValues";
import { ATTEMPT_HEADER, count, freshDb, load } from "./helpers";

const SUMMARY_TABLES = [
  "attempt_tallies",
  "network_tallies",
  "network_values",
  "learner_tallies",
  "learner_quarters",
  "learner_quarter_counts",
  "instructor_values",
  "instructor_running_values",
];

/** Every summary row, in a stable order (values as SQLite stores them, blobs by their bytes). */
function summaries(db: Db): Record<string, string[]> {
  return Object.fromEntries(
    SUMMARY_TABLES.map((table) => {
      const rows = db.$client.prepare(`SELECT * FROM ${table}`).raw(true).all() as unknown[][];
      const text = rows.map((row) => JSON.stringify(row.map((v) => (Buffer.isBuffer(v) ? v.toString("hex") : v))));
      return [table, text.sort()];
    }),
  );
}

/** An attempt row of class C-001 (2026-07-14) or C-002 (2026-08-02), its values varied by `i` and `variant`. */
function attemptLine(id: string, i: number, variant = 0): string {
  const first = i % 3 !== 0;
  const cls = first ? "C-001" : "C-002";
  const date = first ? "2026-07-14" : "2026-08-02";
  const profile = first ? "adult" : "child";
  const manikin = first ? (i % 2 ? "MK-1" : "MK-2") : i % 4 === 0 ? "" : "MK-3";
  const depthOk = 40 + ((i * 7 + variant * 11) % 60);
  const rateOk = 50 + ((i * 13) % 50);
  const result = ["pass", "fail", ""][i % 3];
  const learner = `L-${String(i % 9).padStart(4, "0")}`;
  return [
    id,
    cls,
    learner,
    manikin,
    profile,
    i % 2 ? "live" : "hidden",
    `${date}T09:${String(i % 60).padStart(2, "0")}:00+02:00`,
    120,
    200 + i,
    110,
    50,
    depthOk,
    100 - depthOk,
    0,
    rateOk,
    100 - rateOk,
    0,
    70 + (i % 30),
    60 + (i % 40),
    (i % 12) + 0.5,
    result,
  ].join(",");
}

const file = (lines: string[]) => `${ATTEMPT_HEADER}\n${lines.join("\n")}\n`;

/** Deletes every attempt, expects every summary empty, inserts them again row by row and returns the summaries. */
function summariesRebuiltRowByRow(db: Db): Record<string, string[]> {
  const sqlite = db.$client;
  const rows = sqlite.prepare("SELECT * FROM attempts ORDER BY rowid").all() as Record<string, unknown>[];
  const columns = Object.keys(rows[0]);
  const insert = sqlite.prepare(`INSERT INTO attempts (${columns.join(", ")}) VALUES (${columns.map((c) => `@${c}`).join(", ")})`);
  let emptied: Record<string, string[]> = {};
  sqlite.transaction(() => {
    sqlite.prepare("DELETE FROM attempts").run();
    refreshInstructorValues(sqlite);
    emptied = summaries(db);
    for (const row of rows) insert.run(row);
    refreshInstructorValues(sqlite);
  })();
  expect(emptied).toEqual(Object.fromEntries(SUMMARY_TABLES.map((table) => [table, []])));
  return summaries(db);
}

describe("a bulk attempts import written from its staging table", () => {
  it("counts and refuses rows as row-by-row writing would, within and across batches of 16", async () => {
    const { db } = await freshDb();
    await load(db, "classes", "classes-valid.csv");
    const lines = Array.from({ length: 40 }, (_, i) => attemptLine(`S-${i}`, i));
    lines[5] = attemptLine("S-4", 4); // the same batch as its first row
    lines[20] = attemptLine("S-3", 3); // a later batch
    const first = await load(db, "attempts", file(lines), { skipInvalid: true });
    expect(first).toMatchObject({ status: "imported", inserted: 38, updated: 0, unchanged: 0, rejected: 2 });
    expect(first.issues).toEqual([
      { row: 6, column: "attempt_id", reason: "attempt S-4 appears more than once in this file" },
      { row: 21, column: "attempt_id", reason: "attempt S-3 appears more than once in this file" },
    ]);
    expect(count(db, "attempts")).toBe(38);
    // file order kept: the table's rows in the order of the file's accepted rows
    const ids = db.$client.prepare("SELECT id FROM attempts ORDER BY rowid").pluck().all();
    expect(ids).toEqual(lines.filter((_, i) => i !== 5 && i !== 20).map((line) => line.split(",")[0]));
    expect(count(db, "temp.qb_staged_attempts")).toBe(0);
    expect(count(db, "summary_pending") + count(db, "summary_deferral") + count(db, "instructor_values_stale")).toBe(0);
    const afterFirst = summaries(db);

    // stored rows among new ones in full batches: S-0…S-9 corrected (S-5 was never stored: new), S-10…S-19 as
    // they were, one stored row twice
    const second = [
      ...Array.from({ length: 20 }, (_, i) => attemptLine(`S-${i}`, i, i < 10 ? 1 : 0)),
      ...Array.from({ length: 20 }, (_, i) => attemptLine(`T-${i}`, 40 + i)),
      attemptLine("S-0", 0, 2),
    ];
    const again = await load(db, "attempts", file(second), { skipInvalid: true });
    expect(again).toMatchObject({ status: "imported", inserted: 21, updated: 9, unchanged: 10, rejected: 1 });
    expect(again.issues).toEqual([{ row: 41, column: "attempt_id", reason: "attempt S-0 appears more than once in this file" }]);
    expect(count(db, "batch_changes", `batch_id = ${again.batchId}`)).toBe(9);
    expect(count(db, "attempts")).toBe(59);
    const afterSecond = summaries(db);
    expect(afterSecond).not.toEqual(afterFirst);

    // undo takes out the new rows and restores the corrected ones, summaries with them
    undoBatch(db, again.batchId!, null);
    expect(count(db, "attempts")).toBe(38);
    expect(summaries(db)).toEqual(afterFirst);
    db.$client.close();
  });

  it("keeps the summaries the per-row triggers keep, including learners and instructors' packed rows", async () => {
    const { db } = await freshDb();
    await load(db, "classes", "classes-valid.csv");
    await load(db, "attempts", file(Array.from({ length: 50 }, (_, i) => attemptLine(`S-${i}`, i))));
    await load(db, "attempts", file(Array.from({ length: 37 }, (_, i) => attemptLine(`S-${i + 30}`, i + 30, 1))));
    expect(count(db, "attempts")).toBe(67);
    const imported = summaries(db);
    expect(imported.learner_tallies.length).toBeGreaterThan(0);
    expect(imported.instructor_running_values.length).toBeGreaterThan(0);
    expect(summariesRebuiltRowByRow(db)).toEqual(imported);
    db.$client.close();
  });

  it("writes nothing for a refused file, and the next import starts from an empty staging table", async () => {
    const { db } = await freshDb();
    await load(db, "classes", "classes-valid.csv");
    await load(db, "attempts", file(Array.from({ length: 20 }, (_, i) => attemptLine(`S-${i}`, i))));
    const before = summaries(db);
    const lines = Array.from({ length: 40 }, (_, i) => attemptLine(`R-${i}`, i));
    lines[33] = lines[33].replace(",110,50,", ",110,500,");
    const refused = await load(db, "attempts", file(lines));
    expect(refused).toMatchObject({ status: "refused", inserted: 0 });
    expect(refused.issues).toEqual([{ row: 34, column: "depth_mm", reason: "500 is outside 0–100 mm" }]);
    expect(count(db, "attempts")).toBe(20);
    expect(summaries(db)).toEqual(before);
    const next = await load(db, "attempts", file(Array.from({ length: 17 }, (_, i) => attemptLine(`N-${i}`, i))));
    expect(next).toMatchObject({ status: "imported", inserted: 17 });
    expect(count(db, "attempts")).toBe(37);
    expect(count(db, "attempts", "id LIKE 'R-%'")).toBe(0);
    db.$client.close();
  });
});
