// One seeded demo database per run, copied with SQLite's backup for each journey: seeding takes seconds,
// a copy a fraction of one. Journey files run one after another in separate workers, so the template is
// kept in a temp folder named after the vitest process that started them.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import Database from "better-sqlite3";
import { openDatabase, type Db } from "../../../server/db/client";
import { seedDemo } from "../../../server/seed/seedDemo";

/** The demo network's "today": its current quarter is 2026-Q4. */
export const SEED_TODAY = "2026-12-01";
/** The quarter of SEED_TODAY: the latest quarter with data, which the insight pages open on. */
export const SEED_QUARTER = `${SEED_TODAY.slice(0, 4)}-Q${Math.ceil(Number(SEED_TODAY.slice(5, 7)) / 3)}`;

const templatesRoot = path.join(os.tmpdir(), "quarterbeat-e2e");

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

/** Templates left by earlier runs whose vitest process has gone. */
function removeStaleTemplates() {
  if (!fs.existsSync(templatesRoot)) return;
  for (const name of fs.readdirSync(templatesRoot)) {
    const pid = Number(/^run-(\d+)$/.exec(name)?.[1]);
    if (pid && pid !== process.ppid && !alive(pid)) fs.rmSync(path.join(templatesRoot, name), { recursive: true, force: true });
  }
}

async function templateFile(): Promise<string> {
  const dir = path.join(templatesRoot, `run-${process.ppid}`);
  const file = path.join(dir, `demo-${SEED_TODAY}.sqlite`);
  if (fs.existsSync(file)) return file;
  removeStaleTemplates();
  fs.mkdirSync(dir, { recursive: true });
  const building = path.join(dir, `building-${process.pid}.sqlite`);
  const db = openDatabase(building);
  await seedDemo(db, { today: SEED_TODAY });
  db.$client.pragma("wal_checkpoint(TRUNCATE)");
  db.$client.close();
  fs.renameSync(building, file);
  for (const suffix of ["-wal", "-shm"]) fs.rmSync(building + suffix, { force: true });
  return file;
}

/** A fresh copy of the seeded demo network in its own temp folder, opened and migrated like the server does. */
export async function seededDatabase(journey: string): Promise<{ db: Db; file: string; dir: string }> {
  const template = await templateFile();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), `qb-e2e-${journey}-`));
  const file = path.join(dir, "quarterbeat.sqlite");
  const source = new Database(template, { readonly: true });
  try {
    await source.backup(file);
  } finally {
    source.close();
  }
  return { db: openDatabase(file), file, dir };
}
