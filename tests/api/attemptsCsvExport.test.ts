// The attempts CSV export of a whole quarter is written a chunk at a time, giving the server's event loop back
// between chunks and waiting while the reader is slow, and still holds one state of the data: rows deleted
// while the download runs are in the file, as they were when it started.
import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../server/db/client";
import { selectRowIds } from "../../server/insight/attempts";
import { attemptOrder, attemptSearchConditions, type AttemptSearch } from "../../server/insight/attemptSearch";
import { writeAttemptsCsv } from "../../server/insight/attemptsCsv";
import { resolvePeriod, type ResolvedFilters } from "../../server/insight/filters";
import { generateNetwork } from "../fixtures/insight/generateNetwork";
import { tempDbFile } from "../helpers/testApp";

const file = tempDbFile("qb-csv-export");
let db: Db;
let attemptCount: number;

beforeAll(() => {
  // 50 instructors × 3 classes × 10 attempts in one quarter: 1,500 attempts, three chunks of 500
  ({ db, attempts: attemptCount } = generateNetwork(file, { instructors: 50, quarters: 1, classesPerInstructorQuarter: 3, attemptsPerClass: 10 }));
});
afterAll(() => {
  db.$client.close();
  fs.rmSync(path.dirname(file), { recursive: true, force: true });
});

const search: AttemptSearch = {
  error: null,
  classId: null,
  stream: null,
  learner: null,
  learnerMatch: "exact",
  sort: "score",
  dir: "desc",
  onlyInstructorId: null,
};

describe("attempts CSV export", () => {
  it("writes in chunks, waits for a slow reader, and keeps the state of the data it started with", async () => {
    expect(attemptCount).toBe(1500);
    const filters: ResolvedFilters = { period: resolvePeriod(db, {}), siteId: null, profile: null, feedback: null, instructorId: null, manikinId: null };
    const expectedIds = selectRowIds(db, attemptSearchConditions(filters, search))
      .orderBy(...attemptOrder(search))
      .all()
      .map((row) => row.id);
    expect(expectedIds).toHaveLength(1500);

    const writes: string[] = [];
    let release!: () => void;
    const releasedOnce = new Promise<void>((resolve) => (release = resolve));
    let waited = 0;
    const sink = {
      // the reader is full after the header and the first chunk, once
      write: (text: string) => (writes.push(text), writes.length !== 2),
      drained: () => (waited++, releasedOnce),
      closed: () => false,
    };
    const exporting = writeAttemptsCsv(db.$client.name, filters, search, sink);

    // while the export waits for the reader, another connection deletes half the attempts
    for (let i = 0; i < 20 && waited === 0; i++) await new Promise((resolve) => setTimeout(resolve, 10));
    expect(waited).toBe(1);
    db.$client.prepare("DELETE FROM attempts WHERE rowid IN (SELECT rowid FROM attempts ORDER BY id LIMIT 750)").run();
    expect(db.$client.prepare("SELECT count(*) FROM attempts").pluck().get()).toBe(750);
    release();

    expect(await exporting).toBe(1500);
    expect(writes).toHaveLength(4); // header, then three chunks
    const lines = writes.join("").slice(0, -2).split("\r\n");
    expect(lines.slice(1).map((line) => line.split(",")[0])).toEqual(expectedIds);
  });
});
