// The restore drill: a demo database is backed up while the server serves requests and an import runs, the
// copy is restored with `quarterbeat restore` into a new file, and the restored file holds exactly what the
// backup holds (every table's row count, a checksum of every attempt) and serves the app again.
import { createHash } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDatabase, type Db } from "../../server/db/client";
import { seedDemo } from "../../server/seed/seedDemo";
import { quarterSummary } from "../../server/stats/quarterSummary";
import { makeTestApp, seedPeople, tempDbFile } from "../helpers/testApp";
import { CLASSES_FIXTURE, countRows, integrity, runCli, startCli, tableCounts, waitFor, writeAttemptsFile, writeLockHeld } from "./helpers";
import { serve, traffic } from "./traffic";

const IMPORT_ROWS = 30_000;

let dbFile: string;
let db: Db;
let close: () => Promise<void>;
let base: string;
let dir: string;

/** sha256 over every attempt row, every column, in id order: equal only if no attempt was lost or changed. */
function attemptsChecksum(file: string): { rows: number; sha256: string } {
  const conn = new Database(file, { readonly: true });
  try {
    const hash = createHash("sha256");
    let rows = 0;
    for (const row of conn.prepare("SELECT * FROM attempts ORDER BY id").raw().iterate() as Iterable<unknown[]>) {
      hash.update(JSON.stringify(row));
      hash.update("\n");
      rows++;
    }
    return { rows, sha256: hash.digest("hex") };
  } finally {
    conn.close();
  }
}

beforeAll(async () => {
  dbFile = tempDbFile("qb-restore-drill");
  dir = path.dirname(dbFile);
  db = openDatabase(dbFile);
  await seedPeople(db); // the traffic's coordinator, and sites and instructors for the classes fixture
  await seedDemo(db, { today: "2026-10-15" });
  const classes = await runCli(dbFile, ["import", "classes", CLASSES_FIXTURE]);
  expect(classes.code, classes.stderr).toBe(0);
  ({ base, close } = await serve(db));
}, 300_000);
afterAll(async () => {
  await close();
  db.$client.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe("restore drill", () => {
  it("restores a backup taken while serving and importing, losing nothing", { timeout: 600_000 }, async () => {
    const backup = path.join(dir, "backup.sqlite");
    const restored = path.join(dir, "restored", "quarterbeat.sqlite");
    const attemptsBefore = countRows(dbFile, "SELECT count(*) FROM attempts");
    const batchesBefore = countRows(dbFile, "SELECT count(*) FROM import_batches");
    expect(attemptsBefore).toBeGreaterThan(5000); // the demo network is there

    const load = { stop: false };
    const statuses = traffic(base, () => load.stop, "DRILL");
    const importing = startCli(dbFile, ["import", "attempts", writeAttemptsFile(path.join(dir, "attempts.csv"), "DRILL", IMPORT_ROWS)]);
    // the import holds the write lock while it writes its one transaction: back up in the middle of it
    expect(await waitFor(() => importing.child.exitCode !== null || writeLockHeld(dbFile), 120_000)).toBe(true);
    const backedUp = await runCli(dbFile, ["backup", backup]);
    const imported = await importing.done;
    load.stop = true;
    const answered = await statuses;

    expect(backedUp.code, backedUp.stderr).toBe(0);
    expect(imported.code, imported.stderr).toBe(0);
    expect(answered.filter((status) => status >= 500)).toEqual([]);
    expect(integrity(backup)).toBe("ok");
    // the backup holds all of the import or none of it
    const copiedImport = countRows(backup, "SELECT count(*) FROM attempts WHERE id LIKE 'DRILL-%'");
    expect([0, IMPORT_ROWS]).toContain(copiedImport);
    expect(countRows(backup, "SELECT count(*) FROM import_batches")).toBe(batchesBefore + (copiedImport ? 1 : 0));

    const restore = await runCli(restored, ["restore", backup]);
    expect(restore.code, restore.stderr).toBe(0);
    expect(integrity(restored)).toBe("ok");

    // nothing lost: every table, and every attempt column by column
    const counts = tableCounts(backup, []);
    expect(Object.keys(counts)).toEqual(
      expect.arrayContaining(["attempts", "classes", "compression_streams", "equipment_events", "users", "__drizzle_migrations"]),
    );
    expect(tableCounts(restored, [])).toEqual(counts);
    const checksum = attemptsChecksum(backup);
    expect(checksum.rows).toBe(attemptsBefore + copiedImport);
    expect(attemptsChecksum(restored)).toEqual(checksum);

    // and the restored file serves again: the app answers ready on it, and figures equal the backup's
    const restoredDb = openDatabase(restored);
    const backupDb = openDatabase(backup, { migrate: false });
    try {
      await request(makeTestApp(restoredDb)).get("/api/health/ready").expect(200);
      for (const quarter of ["2026-Q2", "2026-Q3"]) expect(quarterSummary(restoredDb, quarter), quarter).toEqual(quarterSummary(backupDb, quarter));
    } finally {
      restoredDb.$client.close();
      backupDb.$client.close();
    }
  });
});
