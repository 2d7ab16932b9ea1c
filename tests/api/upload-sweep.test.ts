// Uploads live in memory, so a stopped server leaves its upload folder behind. A starting server removes the
// folders of servers that are gone and leaves those of live ones (another server or test worker) alone.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../server/db/client";
import { makeTestApp, makeTestDb } from "../helpers/testApp";

/** A process id above the kernel's limit: no process can have it, so its folder is certainly orphaned. */
function deadPid(): number {
  try {
    return Number(fs.readFileSync("/proc/sys/kernel/pid_max", "utf8")) + 1;
  } catch {
    return 2 ** 22 + 1;
  }
}

let db: Db;
let root: string;

beforeAll(() => {
  db = makeTestDb();
  root = fs.mkdtempSync(path.join(os.tmpdir(), "qb-upload-sweep-"));
});
afterAll(() => {
  db.$client.close();
  fs.rmSync(root, { recursive: true, force: true });
});

/** A folder under the test's temp root holding one uploaded file. */
function folder(name: string, ageMs = 0): string {
  const dir = path.join(root, name);
  fs.mkdirSync(dir);
  fs.writeFileSync(path.join(dir, "0123456789abcdef0123456789abcdef.csv"), "class_id\n");
  const when = new Date(Date.now() - ageMs);
  fs.utimesSync(dir, when, when);
  return dir;
}

/** Builds the app as the server does at start-up, with the temp folder pointing at the test's root. */
function startServer() {
  const saved = process.env.TMPDIR;
  process.env.TMPDIR = root;
  try {
    return makeTestApp(db);
  } finally {
    if (saved === undefined) delete process.env.TMPDIR;
    else process.env.TMPDIR = saved;
  }
}

describe("upload folders at start-up", () => {
  it("removes the folders of stopped servers and of an older version once old, and keeps everything else", async () => {
    const stopped = folder(`quarterbeat-uploads-${deadPid()}-Ab3dE9`);
    const running = folder(`quarterbeat-uploads-${process.pid}-Zz9yX8`);
    const oldUnowned = folder("quarterbeat-uploads-Qw12Er", 7 * 60 * 60 * 1000);
    const recentUnowned = folder("quarterbeat-uploads-Ty34Ui", 60 * 1000);
    const unrelated = folder("someone-elses-folder", 7 * 60 * 60 * 1000);
    fs.writeFileSync(path.join(root, "quarterbeat-uploads-a-file"), "not a folder");

    startServer();

    expect(fs.existsSync(stopped)).toBe(false);
    expect(fs.existsSync(oldUnowned)).toBe(false);
    for (const kept of [running, recentUnowned, unrelated, path.join(root, "quarterbeat-uploads-a-file")]) expect(fs.existsSync(kept), kept).toBe(true);
    // the new server's own folder carries its process id, so the next start keeps it while this one runs
    const own = fs.readdirSync(root).filter((name) => name.startsWith(`quarterbeat-uploads-${process.pid}-`) && path.join(root, name) !== running);
    expect(own).toHaveLength(1);
    expect(fs.statSync(path.join(root, own[0])).mode & 0o777).toBe(0o700);

    // a second server start in the same (live) process sweeps nothing of the first
    startServer();
    expect(fs.existsSync(path.join(root, own[0]))).toBe(true);
    expect(fs.existsSync(running)).toBe(true);
  });
});
