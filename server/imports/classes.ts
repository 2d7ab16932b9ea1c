// Class logs: one row per class an instructor taught.
import type { RowReader } from "../../shared/import/rows";
import { quarterOf } from "../../shared/period";
import type { KindImporter } from "./kind";
import { RowStore } from "./rowStore";
import type { ImportRun } from "./run";

const COLUMNS = [
  "id",
  "date",
  "quarter",
  "site_id",
  "instructor_id",
  "course",
  "learners",
  "passed",
  "manikins",
  "lungs_replaced",
  "mouthpieces_cleaned",
  "batteries_replaced",
  "batch_id",
] as const;

export function classesImporter(run: ImportRun, reader: RowReader): KindImporter {
  const store = new RowStore(run.sqlite, {
    table: "classes",
    key: "id",
    columns: COLUMNS,
    write: run.write,
    batchId: run.batchId,
    recordChange: run.recordChange,
  });
  // Attempts copy their class's quarter, site and instructor: keep the copies in step with a correction.
  const syncAttempts = run.sqlite.prepare("UPDATE attempts SET quarter = ?, site_id = ?, instructor_id = ? WHERE class_id = ?");

  return {
    unit: "rows",
    row(fields, row) {
      const issues = reader.issues;
      issues.length = 0;
      const cls = reader.at(fields, row).classRow();
      if (!cls) return run.rejectRow(fields, issues);

      const outOfScope = run.instructorScope?.classIssue(cls);
      if (outOfScope) {
        reader.fail(outOfScope.column, outOfScope.reason);
        return run.rejectRow(fields, issues);
      }

      const siteId = run.codes.site(cls.siteCode);
      const instructorId = run.codes.instructor(cls.instructorCode, siteId);
      for (const asset of cls.manikins) run.codes.manikin(asset, siteId);
      const quarter = quarterOf(cls.date);
      const values = [
        cls.id,
        cls.date,
        quarter,
        siteId,
        instructorId,
        cls.course,
        cls.learners,
        cls.passed,
        cls.manikins.join(";"),
        cls.lungsReplaced,
        cls.mouthpiecesCleaned,
        cls.batteriesReplaced,
        run.batchId,
      ];
      const outcome = store.write(values);
      if (outcome === "duplicate") {
        reader.fail("class_id", `class ${cls.id} appears more than once in this file`);
        return run.rejectRow(fields, issues);
      }
      if (outcome === "refused") {
        reader.fail("class_id", store.refusal);
        return run.rejectRow(fields, issues);
      }
      run.count(outcome);
      if (outcome === "updated" && run.write) syncAttempts.run(quarter, siteId, instructorId, cls.id);
      // A dry run writes nothing, so later files of the same command learn about these classes from here.
      if (!run.write) run.pendingClasses.set(cls.id, { date: cls.date, quarter, siteId, instructorId });
    },
    finish() {},
  };
}
