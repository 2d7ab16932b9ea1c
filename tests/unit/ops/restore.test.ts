// The restore service: what it refuses (and says why) and what it restores.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDatabase } from "../../../server/db/client";
import { AppError } from "../../../server/errors";
import { restoreDatabase } from "../../../server/ops/restore";
import { holdServerLock, lockFileOf } from "../../../server/ops/serverLock";
import { createSite } from "../../../server/sites/service";
import { tempDbFile } from "../../helpers/testApp";

let backup: string;
let dir: string;
let n = 0;
const target = () => path.join(dir, `target-${++n}.sqlite`);

/** The AppError a restore is refused with. */
async function refusal(promise: Promise<unknown>): Promise<AppError> {
  const err = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(AppError);
  return err as AppError;
}

function sites(file: string): string[] {
  const conn = new Database(file, { readonly: true });
  try {
    return conn.prepare("SELECT code FROM sites ORDER BY code").pluck().all() as string[];
  } finally {
    conn.close();
  }
}

beforeAll(async () => {
  const original = tempDbFile("qb-restore");
  dir = path.dirname(original);
  const db = openDatabase(original);
  createSite(db, { code: "KEEP", name: "Site in the backup" });
  // enough rows to span many pages, so that damage to one page is found by the integrity check
  const insert = db.$client.prepare("INSERT INTO settings (key, value) VALUES (?, ?)");
  db.$client.transaction(() => {
    for (let i = 0; i < 3000; i++) insert.run(`filler-${i}`, "x".repeat(200));
  })();
  backup = path.join(dir, "backup.sqlite");
  await db.$client.backup(backup);
  db.$client.close();
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe("restoreDatabase", () => {
  it("restores into a new file with the backup's rows and reports the migration level", async () => {
    const to = target();
    const result = await restoreDatabase({ backupFile: backup, targetFile: to });
    expect(result).toMatchObject({ replaced: false, migration: { current: true } });
    expect(result.tables.sites).toBe(1);
    expect(sites(to)).toEqual(["KEEP"]);
    // no staging copy left, and reading the backup left no -wal or -shm beside it
    expect(fs.readdirSync(dir).filter((f) => f.includes("restoring") || f.startsWith("backup.sqlite-"))).toEqual([]);
  });

  it("refuses an existing database without force, and replaces it with force (dropping its old write-ahead log)", async () => {
    const to = target();
    const db = openDatabase(to);
    createSite(db, { code: "GONE", name: "Site written after the backup" });
    db.$client.close();
    fs.writeFileSync(`${to}-wal`, "left over from the old database");

    const err = await refusal(restoreDatabase({ backupFile: backup, targetFile: to }));
    expect(err.message).toBe(`${to} already exists.`);
    expect(err.hint).toMatch(/--force/);
    expect(sites(to)).toContain("GONE");

    expect((await restoreDatabase({ backupFile: backup, targetFile: to, force: true })).replaced).toBe(true);
    expect(fs.existsSync(`${to}-wal`) && fs.readFileSync(`${to}-wal`, "utf8").includes("left over")).toBe(false);
    expect(sites(to)).toEqual(["KEEP"]);
  });

  it("refuses a database a running server holds, even with force", async () => {
    const to = target();
    openDatabase(to).$client.close();
    const release = holdServerLock(to);
    try {
      const err = await refusal(restoreDatabase({ backupFile: backup, targetFile: to, force: true }));
      expect(err.code).toBe("database_in_use");
      expect(err.message).toMatch(new RegExp(`in use by a running Quarterbeat server \\(process ${process.pid} on `));
      expect(err.hint).toContain(lockFileOf(to));
    } finally {
      release();
    }
    expect(fs.existsSync(lockFileOf(to))).toBe(false);
    await restoreDatabase({ backupFile: backup, targetFile: to, force: true });
  });

  it("takes over a lock left by a server that is gone", async () => {
    const to = target();
    const gone = spawnSync(process.execPath, ["-e", "console.log(process.pid)"], { encoding: "utf8" });
    const host = (await import("node:os")).hostname();
    fs.writeFileSync(lockFileOf(to), JSON.stringify({ pid: Number(gone.stdout.trim()), host, startedAt: "2026-01-01T00:00:00Z" }));
    await restoreDatabase({ backupFile: backup, targetFile: to });
    expect(sites(to)).toEqual(["KEEP"]);
    expect(fs.existsSync(lockFileOf(to))).toBe(false);
  });

  it("refuses a server lock written on another host: it cannot be checked from here", async () => {
    const to = target();
    fs.writeFileSync(lockFileOf(to), JSON.stringify({ pid: 1, host: "some-other-host", startedAt: "2026-01-01T00:00:00Z" }));
    expect((await refusal(restoreDatabase({ backupFile: backup, targetFile: to }))).code).toBe("database_in_use");
  });

  it("refuses a missing file, a file that is not a database and another application's database", async () => {
    const missing = path.join(dir, "no-such-backup.sqlite");
    expect((await refusal(restoreDatabase({ backupFile: missing, targetFile: target() }))).message).toBe(`There is no file ${missing}.`);

    const text = path.join(dir, "notes.txt");
    fs.writeFileSync(text, "attempt_id,class_id\n".repeat(400));
    expect((await refusal(restoreDatabase({ backupFile: text, targetFile: target() }))).message).toBe(`${text} is not an SQLite database.`);

    const other = path.join(dir, "other.sqlite");
    const conn = new Database(other);
    conn.exec("CREATE TABLE recipes (id INTEGER PRIMARY KEY, name TEXT)");
    conn.close();
    expect((await refusal(restoreDatabase({ backupFile: other, targetFile: target() }))).message).toMatch(
      /not a Quarterbeat one: it has no __drizzle_migrations table/,
    );
  });

  it("refuses a damaged backup, naming the integrity check", async () => {
    const damaged = path.join(dir, "damaged.sqlite");
    fs.copyFileSync(backup, damaged);
    const pageSize = fs.readFileSync(damaged).readUInt16BE(16);
    const pages = fs.statSync(damaged).size / pageSize;
    const fd = fs.openSync(damaged, "r+");
    // scribble over the middle page's b-tree header and cells
    fs.writeSync(fd, Buffer.alloc(pageSize, 0x7f), 0, pageSize, Math.floor(pages / 2) * pageSize);
    fs.closeSync(fd);
    const to = target();
    const err = await refusal(restoreDatabase({ backupFile: damaged, targetFile: to }));
    expect(err.message).toMatch(new RegExp(`^${damaged.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")} failed SQLite's integrity check: `));
    expect(fs.existsSync(to)).toBe(false);
  });

  it("refuses a backup made by a newer version, and restoring a file onto itself", async () => {
    const newer = path.join(dir, "newer.sqlite");
    fs.copyFileSync(backup, newer);
    const conn = new Database(newer);
    conn.prepare("INSERT INTO __drizzle_migrations (hash, created_at) VALUES ('future', ?)").run(Date.UTC(2099, 0, 1));
    conn.close();
    expect((await refusal(restoreDatabase({ backupFile: newer, targetFile: target() }))).message).toMatch(/written by a newer Quarterbeat/);
    expect((await refusal(restoreDatabase({ backupFile: backup, targetFile: backup, force: true }))).message).toMatch(/same file/);
  });
});
