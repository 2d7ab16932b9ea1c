// `quarterbeat backup <file>` while the server is up and busy (reads, writes, an import): the copy is a
// consistent database of its own, and the quarter statistics computed on it equal the original's.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import Database from "better-sqlite3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDatabase, type Db } from "../../server/db/client";
import { quarterSummary } from "../../server/stats/quarterSummary";
import { tempDbFile } from "../helpers/testApp";
import { seedInsightNetwork } from "../fixtures/insight/network";
import { CLASSES_FIXTURE, integrity, runCli, sleep, startCli, tableCounts, waitFor, writeAttemptsFile, writeLockHeld } from "./helpers";
import { serve, traffic } from "./traffic";

const QUARTERS = ["2025-Q3", "2025-Q4", "2026-Q1", "2026-Q2", "2026-Q3"];

let dbFile: string;
let db: Db;
let close: () => Promise<void>;
let base: string;
let dir: string;

beforeAll(async () => {
  dbFile = tempDbFile("qb-fault-backup");
  db = openDatabase(dbFile);
  await seedInsightNetwork(db);
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "qb-fault-backup-files-"));
  expect((await runCli(dbFile, ["import", "classes", CLASSES_FIXTURE])).code).toBe(0);
  const attempts = writeAttemptsFile(path.join(dir, "attempts.csv"), "BK", 20_000);
  const imported = await runCli(dbFile, ["import", "attempts", attempts]);
  expect(imported.code, imported.stderr).toBe(0);
  ({ base, close } = await serve(db));
}, 300_000);
afterAll(async () => {
  await close();
  db.$client.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

async function stats(file: string, quarter: string): Promise<unknown> {
  const res = await runCli(file, ["stats", "--quarter", quarter, "--json"]);
  expect(res.code, res.stderr).toBe(0);
  return JSON.parse(res.stdout);
}

describe("backup while the server serves requests", () => {
  it("makes a consistent copy whose statistics equal the original's", { timeout: 300_000 }, async () => {
    const copy = path.join(dir, "copy.sqlite");
    let backupDone = false;
    const load = traffic(base, () => backupDone);
    await sleep(300); // the traffic is under way before the backup starts
    const backup = await runCli(dbFile, ["backup", copy]);
    backupDone = true;
    const statuses = await load;

    expect(backup.code, backup.stderr).toBe(0);
    expect(backup.stdout).toMatch(/Backed up/);
    expect(statuses.length).toBeGreaterThan(0);
    expect(statuses.filter((s) => s >= 500)).toEqual([]);
    expect(new Set(statuses)).toEqual(new Set([200, 201]));

    expect(integrity(copy)).toBe("ok");
    // rows the traffic did not touch are all there; sites the traffic added are there up to the backup; the
    // backup's own record (and its autoincrement counter) is written to the database after the copy
    const skip = ["sessions", "sites", "backup_log", "sqlite_sequence"];
    expect(tableCounts(dbFile, [])["backup_log"]).toBe(1);
    expect(tableCounts(copy, skip)).toEqual(tableCounts(dbFile, skip));
    expect(tableCounts(copy, [])["attempts"]).toBeGreaterThan(20_000);
    // the command a person would run, for the quarters with the fixture's and the import's data …
    for (const quarter of ["2026-Q2", "2026-Q3"]) {
      expect(await stats(copy, quarter), quarter).toEqual(await stats(dbFile, quarter));
    }
    // … and the same service in this process for every quarter
    const original = openDatabase(dbFile, { migrate: false });
    const copied = openDatabase(copy, { migrate: false });
    try {
      expect(quarterSummary(original, "2026-Q3").attempts).toBeGreaterThanOrEqual(20_000);
      for (const quarter of QUARTERS) expect(quarterSummary(copied, quarter), quarter).toEqual(quarterSummary(original, quarter));
    } finally {
      original.$client.close();
      copied.$client.close();
    }
  });

  it("copies either none or all of an import under way, never part of it", { timeout: 300_000 }, async () => {
    const copy = path.join(dir, "copy-during-import.sqlite");
    const file = writeAttemptsFile(path.join(dir, "during.csv"), "DUR", 30_000);
    const before = tableCounts(dbFile, ["sessions"]);
    const load = { stop: false };
    const reads = traffic(base, () => load.stop);
    const importing = startCli(dbFile, ["import", "attempts", file, "--json"]);
    expect(await waitFor(() => importing.child.exitCode !== null || writeLockHeld(dbFile), 120_000)).toBe(true);
    const backup = await runCli(dbFile, ["backup", copy]);
    const imported = await importing.done;
    load.stop = true;
    await reads;

    expect(backup.code, backup.stderr).toBe(0);
    expect(imported.code, imported.stderr).toBe(0);
    expect(integrity(copy)).toBe("ok");
    const conn = new Database(copy, { readonly: true });
    const copied = conn.prepare("SELECT count(*) FROM attempts WHERE id LIKE 'DUR-%'").pluck().get();
    const batches = conn.prepare("SELECT count(*) FROM import_batches").pluck().get();
    conn.close();
    expect([0, 30_000]).toContain(copied);
    expect(batches).toBe(copied === 0 ? before.import_batches : before.import_batches + 1);
  });
});
