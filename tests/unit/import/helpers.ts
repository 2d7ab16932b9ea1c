// Shared set-up for the import tests: a fresh database with the test people, fixture paths, CSV from text.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { Readable } from "node:stream";
import type { ImportKind } from "../../../shared/domain";
import type { ImportMapping } from "../../../shared/import/mapping";
import type { Db } from "../../../server/db/client";
import { importFile, type ImportFileOptions } from "../../../server/imports/service";
import { makeTestDb, seedPeople } from "../../helpers/testApp";

export const fixture = (name: string) => path.resolve("tests/fixtures/import", name);

export async function freshDb() {
  const db = makeTestDb();
  const people = await seedPeople(db);
  return { db, people };
}

/** Imports a fixture file (path) or CSV text (stream) through the service, as the CLI would. */
export function load(db: Db, kind: ImportKind, file: string, options: Partial<ImportFileOptions> & { mapping?: ImportMapping } = {}) {
  const input = file.includes("\n") ? { stream: Readable.from([file]), fileName: `${kind}.csv` } : { path: fixture(file) };
  return importFile(db, { kind, input, source: "cli", ...options });
}

export function count(db: Db, table: string, where = "1"): number {
  return db.$client.prepare(`SELECT count(*) FROM ${table} WHERE ${where}`).pluck().get() as number;
}

export function tempFile(name: string, text: string): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "qb-import-"));
  const file = path.join(dir, name);
  fs.writeFileSync(file, text);
  return file;
}

export const ATTEMPT_HEADER =
  "attempt_id,class_id,learner,manikin,profile,feedback,started_at,duration_s,compressions,rate_cpm,depth_mm,depth_ok_pct,too_shallow_pct,too_deep_pct,rate_ok_pct,too_slow_pct,too_fast_pct,recoil_ok_pct,hands_on_pct,longest_pause_s,instructor_result";
export const STREAM_HEADER = "attempt_id,class_id,learner,manikin,profile,feedback,started_at,instructor_result,t_ms,depth_mm,release_mm";
