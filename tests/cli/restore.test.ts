// `quarterbeat backup` and `quarterbeat restore` as a person runs them: exit codes and what they say.
import fs from "node:fs";
import path from "node:path";
import Database from "better-sqlite3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDatabase } from "../../server/db/client";
import { holdServerLock } from "../../server/ops/serverLock";
import { createSite } from "../../server/sites/service";
import { cli } from "../helpers/cli";
import { tempDbFile } from "../helpers/testApp";

// Each CLI run starts Node and tsx afresh: seconds each on a busy machine.
const SLOW = { timeout: 180_000 };

const siteCodes = (file: string) => {
  const conn = new Database(file, { readonly: true });
  try {
    return conn.prepare("SELECT code FROM sites ORDER BY code").pluck().all();
  } finally {
    conn.close();
  }
};

let original: string;
let dir: string;
beforeAll(() => {
  original = tempDbFile("qb-cli-restore");
  dir = path.dirname(original);
  const db = openDatabase(original);
  createSite(db, { code: "NORTH", name: "Northfield Hall" });
  db.$client.close();
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe("quarterbeat backup, then restore", () => {
  it("restores a backup into a new database and says what it restored", SLOW, () => {
    const backup = path.join(dir, "backup.sqlite");
    const backedUp = cli(["--db", original, "backup", backup]);
    expect(backedUp.stderr).toBe("");
    expect(backedUp.code).toBe(0);

    const restored = path.join(dir, "restored", "quarterbeat.sqlite");
    const res = cli(["--db", restored, "restore", backup]);
    expect(res.stderr).toBe("");
    expect(res.code).toBe(0);
    expect(res.stdout).toContain(`Created ${restored} from ${backup}:`);
    expect(res.stdout).toMatch(/Schema at migration 0\d{3}_/);
    expect(siteCodes(restored)).toEqual(["NORTH"]);
  });

  it("refuses to replace an existing database without --force, with exit code 1 and what to do", SLOW, () => {
    const backup = path.join(dir, "backup.sqlite");
    const res = cli(["--db", original, "restore", backup]);
    expect(res.code).toBe(1);
    expect(res.stderr).toContain(`quarterbeat: ${original} already exists.`);
    expect(res.stderr).toMatch(/→ .*--force/);
  });

  it("refuses a database a running server holds, even with --force", SLOW, () => {
    const release = holdServerLock(original); // this test process stands in for the server
    try {
      const res = cli(["--db", original, "restore", path.join(dir, "backup.sqlite"), "--force"]);
      expect(res.code).toBe(1);
      expect(res.stderr).toContain(`quarterbeat: ${original} is in use by a running Quarterbeat server (process ${process.pid} `);
      expect(res.stderr).toMatch(/→ Stop that server first/);
    } finally {
      release();
    }
  });

  it("refuses a file that is not a backup, naming it", SLOW, () => {
    const notes = path.join(dir, "notes.csv");
    fs.writeFileSync(notes, "attempt_id,class_id\nA-1,C-1\n");
    const res = cli(["--db", path.join(dir, "new.sqlite"), "restore", notes]);
    expect(res.code).toBe(1);
    expect(res.stderr).toContain(`quarterbeat: ${notes} is not an SQLite database.`);
    expect(fs.existsSync(path.join(dir, "new.sqlite"))).toBe(false);
  });
});
