// Undoing an import batch: put back what it updated (from batch_changes), delete what it inserted, remove
// the codes it created when nothing else uses them. Refused, with the reason, when later work depends on it.
import type Database from "better-sqlite3";
import type { Db } from "../db/client";
import { AppError, conflict, notFound } from "../errors";
import { refreshInstructorValues } from "../metrics/instructorValues";
import type { NewCodes } from "./codes";

export interface UndoResult {
  batchId: number;
  deleted: number;
  restored: number;
}

const KEYS: Record<string, string> = {
  classes: "id",
  attempts: "id",
  compression_streams: "attempt_id",
  manikins: "id",
};

/** Tables whose rows carry batch_id, in an order that respects foreign keys when deleting. */
const BATCH_TABLES = ["compression_streams", "attempts", "equipment_events", "classes"] as const;

export function undoBatch(db: Db, batchId: number, userId: number | null): UndoResult {
  const sqlite: Database.Database = db.$client;
  const batch = sqlite.prepare("SELECT id, kind, status, new_codes FROM import_batches WHERE id = ?").get(batchId) as
    { id: number; kind: string; status: string; new_codes: string | null } | undefined;
  if (!batch) throw notFound(`Import batch ${batchId}`);
  if (batch.status === "undone") throw conflict(`Import batch ${batchId} has already been undone.`);

  const run = sqlite.transaction((): UndoResult => {
    // Later batches that updated rows this batch wrote would have their changes lost.
    const later = sqlite
      .prepare(
        `SELECT DISTINCT bc.batch_id FROM batch_changes bc JOIN import_batches b ON b.id = bc.batch_id
         WHERE b.status = 'applied' AND bc.batch_id <> ? AND json_extract(bc.previous, '$.batch_id') = ? ORDER BY bc.batch_id`,
      )
      .pluck()
      .all(batchId, batchId) as number[];
    if (later.length > 0) {
      throw new AppError(
        "conflict",
        409,
        `Import batch ${batchId} cannot be undone: batch${later.length > 1 ? "es" : ""} ${later.join(", ")} changed rows it wrote.`,
        { dependentBatches: later },
        `Undo batch${later.length > 1 ? "es" : ""} ${later.join(", ")} first.`,
      );
    }
    if (batch.kind === "classes") {
      // Classes it inserted would be deleted: refuse while attempts of other batches hang on them.
      const dependents = sqlite
        .prepare(
          `SELECT a.batch_id AS batchId, count(*) AS attempts FROM attempts a JOIN classes c ON c.id = a.class_id
           WHERE c.batch_id = ? AND (a.batch_id IS NULL OR a.batch_id <> ?)
             AND c.id NOT IN (SELECT row_key FROM batch_changes WHERE batch_id = ? AND table_name = 'classes')
           GROUP BY a.batch_id ORDER BY a.batch_id`,
        )
        .all(batchId, batchId, batchId) as { batchId: number | null; attempts: number }[];
      if (dependents.length > 0) {
        const list = dependents.map((d) => (d.batchId === null ? `${d.attempts} attempts without a batch` : `batch ${d.batchId} (${d.attempts} attempts)`));
        const batches = dependents.filter((d) => d.batchId !== null).map((d) => d.batchId);
        throw new AppError(
          "conflict",
          409,
          `Import batch ${batchId} cannot be undone: its classes now have attempts from ${list.join(", ")}.`,
          { dependentBatches: batches },
          batches.length > 0 ? `Undo batch${batches.length > 1 ? "es" : ""} ${batches.join(", ")} first.` : undefined,
        );
      }
    }

    // 1. Put back every row the batch updated (newest change first), with its previous batch id.
    let restored = 0;
    const changes = sqlite.prepare("SELECT table_name, row_key, previous FROM batch_changes WHERE batch_id = ? ORDER BY id DESC").all(batchId) as {
      table_name: string;
      row_key: string;
      previous: string;
    }[];
    const restoredClasses: string[] = [];
    for (const change of changes) {
      const key = KEYS[change.table_name];
      if (!key) throw new Error(`Undo does not know the table ${change.table_name}`);
      const previous = JSON.parse(change.previous) as Record<string, unknown>;
      const columns = Object.keys(previous).filter((c) => c !== key);
      const values = columns.map((c) => {
        const value = previous[c];
        return value && typeof value === "object" && "$base64" in value ? Buffer.from(String((value as { $base64: string }).$base64), "base64") : value;
      });
      restored += sqlite
        .prepare(`UPDATE ${change.table_name} SET ${columns.map((c) => `${c} = ?`).join(", ")} WHERE ${key} = ?`)
        .run(...values, previous[key] ?? change.row_key).changes;
      if (change.table_name === "classes") restoredClasses.push(change.row_key);
    }
    // Attempts copy their class's quarter, site and instructor.
    const resync = sqlite.prepare(
      "UPDATE attempts SET (quarter, site_id, instructor_id) = (SELECT quarter, site_id, instructor_id FROM classes WHERE classes.id = attempts.class_id) WHERE class_id = ?",
    );
    for (const classId of restoredClasses) resync.run(classId);

    // 2. Delete what it inserted: the rows still carrying its id.
    let deleted = 0;
    for (const table of BATCH_TABLES) deleted += sqlite.prepare(`DELETE FROM ${table} WHERE batch_id = ?`).run(batchId).changes;

    // 3. Remove the codes it created, unless something else refers to them now.
    const created = batch.new_codes ? (JSON.parse(batch.new_codes) as NewCodes) : { sites: [], instructors: [], manikins: [] };
    const removeUnused = (sql: string, codes: string[]) => {
      for (const code of codes) {
        sqlite.exec("SAVEPOINT qb_code");
        try {
          sqlite.prepare(sql).run(sql.includes("@code") ? { code } : [code]);
          sqlite.exec("RELEASE qb_code");
        } catch {
          sqlite.exec("ROLLBACK TO qb_code");
          sqlite.exec("RELEASE qb_code");
        }
      }
    };
    removeUnused(
      "DELETE FROM manikins WHERE asset_id = @code AND NOT EXISTS (SELECT 1 FROM classes WHERE ';' || classes.manikins || ';' LIKE '%;' || @code || ';%')",
      created.manikins,
    );
    removeUnused("DELETE FROM instructors WHERE code = ?", created.instructors);
    removeUnused("DELETE FROM sites WHERE code = ?", created.sites);

    sqlite
      .prepare("UPDATE import_batches SET status = 'undone', undone_at = strftime('%Y-%m-%dT%H:%M:%fZ', 'now'), undone_by = ? WHERE id = ?")
      .run(userId, batchId);
    refreshInstructorValues(sqlite);
    return { batchId, deleted, restored };
  });
  return run.immediate();
}
