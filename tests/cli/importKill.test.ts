// A file is one transaction: killing the CLI (kill -9) while it writes leaves the database as it was before
// that file, and running the same command again completes the import.
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import Database from "better-sqlite3";
import { describe, expect, it } from "vitest";
import { writeLockHeld } from "../../server/db/writeLock";
import { tempDbFile } from "../helpers/testApp";

const root = path.resolve(__dirname, "../..");
const ROWS = 300_000;

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe("kill -9 in the middle of an import", () => {
  it("leaves the file's rows absent, and a re-run completes", { timeout: 600_000 }, async () => {
    const db = tempDbFile("qb-cli-kill");
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "qb-cli-kill-"));
    const classes = path.join(root, "tests/fixtures/import/classes-valid.csv");
    const cli = (args: string[]) =>
      spawnSync("npx", ["tsx", "cli/main.ts", "--db", db, ...args], { cwd: root, encoding: "utf8", env: { ...process.env, QUARTERBEAT_DB: "" } });
    expect(cli(["import", "classes", classes]).status).toBe(0);

    const big = path.join(dir, "attempts-big.csv");
    const fd = fs.openSync(big, "w");
    fs.writeSync(
      fd,
      "attempt_id,class_id,learner,manikin,profile,feedback,started_at,duration_s,compressions,rate_cpm,depth_mm,depth_ok_pct,too_shallow_pct,too_deep_pct,rate_ok_pct,too_slow_pct,too_fast_pct,recoil_ok_pct,hands_on_pct,longest_pause_s,instructor_result\n",
    );
    let chunk = "";
    for (let i = 0; i < ROWS; i++) {
      chunk += `K-${i},C-001,L-${i % 5000},MK-1,adult,live,2026-07-14T10:00:00Z,120,230,112,54,85,10,5,80,12,8,90,85,4,\n`;
      if (chunk.length > 1 << 20) {
        fs.writeSync(fd, chunk);
        chunk = "";
      }
    }
    fs.writeSync(fd, chunk);
    fs.closeSync(fd);

    // The CLI as a person starts it; its own process group, so the kill reaches npx, tsx and node alike.
    const child = spawn("npx", ["tsx", "cli/main.ts", "--db", db, "import", "attempts", big], {
      cwd: root,
      detached: true,
      stdio: "ignore",
      env: { ...process.env, QUARTERBEAT_DB: "" },
    });
    const exited = new Promise<void>((resolve) => child.on("exit", () => resolve()));
    let writing = false;
    for (let i = 0; i < 2400 && child.exitCode === null; i++) {
      if (writeLockHeld(db)) {
        writing = true;
        break;
      }
      await sleep(50);
    }
    expect(writing).toBe(true);
    await sleep(1500); // let it insert rows for a while
    expect(child.exitCode).toBeNull(); // still importing: the kill lands mid-file
    process.kill(-child.pid!, "SIGKILL");
    await exited;

    const after = new Database(db);
    expect(after.prepare("SELECT count(*) FROM attempts").pluck().get()).toBe(0);
    expect(after.prepare("SELECT kind FROM import_batches").pluck().all()).toEqual(["classes"]);
    expect(after.prepare("PRAGMA integrity_check").pluck().get()).toBe("ok");
    after.close();

    const rerun = cli(["import", "attempts", big, "--json"]);
    expect(rerun.status).toBe(0);
    expect(JSON.parse(rerun.stdout).files[0]).toMatchObject({ status: "imported", inserted: ROWS });
    const final = new Database(db);
    expect(final.prepare("SELECT count(*) FROM attempts").pluck().get()).toBe(ROWS);
    expect(final.prepare("PRAGMA integrity_check").pluck().get()).toBe("ok");
    final.close();
    fs.rmSync(dir, { recursive: true, force: true });
  });
});
