// Upload and job records are written from the request thread, which must never wait for the write lock that
// a CLI or worker import holds: a write that finds it taken stays pending and lands once the lock is free.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import Database from "better-sqlite3";
import type { Db } from "../../server/db/client";
import { ImportRecords, type JobRecord } from "../../server/imports/records";
import { makeTestDb } from "../helpers/testApp";

let db: Db;
let other: Database.Database;

beforeAll(() => {
  db = makeTestDb();
  other = new Database(db.$client.name);
});
afterAll(() => {
  other.close();
  db.$client.close();
});

const job: JobRecord = {
  id: "job-locked",
  uploadId: "upload-1",
  userId: 1,
  mode: "import",
  status: "queued",
  totalBytes: 100,
  rows: 0,
  summary: null,
  error: null,
  rejectedPath: "/nowhere/upload.csv.job-locked.rejected.csv",
  rejectedKept: false,
  createdAt: "2026-10-02T09:00:00.000Z",
  finishedAt: null,
};

describe("import records while another connection holds the write lock", () => {
  it("keeps the writes pending in order, answers at once, and stores the latest state once the lock is free", async () => {
    const records = new ImportRecords(db);
    other.exec("BEGIN IMMEDIATE"); // as an import's transaction does
    records.saveJob(job);
    records.saveJob({ ...job, status: "running" });
    expect(records.pendingWrites).toBe(1); // the later state replaced the earlier one
    expect(records.findJob(job.id)).toBeNull();

    other.exec("COMMIT");
    for (let i = 0; i < 100 && records.pendingWrites > 0; i++) await new Promise((resolve) => setTimeout(resolve, 20));
    expect(records.pendingWrites).toBe(0);
    expect(records.findJob(job.id)).toMatchObject({ status: "running", rows: 0 });
  });
});
