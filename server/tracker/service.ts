// The coordinator's quarter tracker: for one quarter, each instructor with the classes their class logs hold,
// the attempts measured for those classes (from the attempt summaries), when a class log of theirs was last
// imported, and how many refused rows kept with applied batches name them or one of their classes.
import { sql } from "drizzle-orm";
import type { TrackerAnswer } from "../../shared/schemas/tracker";
import type { Db } from "../db/client";
import { listInstructors } from "../sites/service";
import { networkScope, talliesBy } from "../metrics/summaries";

function countsBy(rows: { instructorId: number | null; n: number }[]): Map<number | null, number> {
  return new Map(rows.map((row) => [row.instructorId, Number(row.n)]));
}

export function quarterTracker(db: Db, quarter: string): TrackerAnswer {
  const classes = countsBy(
    db.all<{ instructorId: number; n: number }>(
      sql`SELECT instructor_id AS instructorId, count(*) AS n FROM classes WHERE quarter = ${quarter} GROUP BY instructor_id`,
    ),
  );
  const attempts = talliesBy<number>(db, networkScope(quarter, quarter), "instructorId");
  const lastImport = new Map(
    db
      .all<{ instructorId: number; at: string }>(
        sql`SELECT c.instructor_id AS instructorId, max(b.created_at) AS at FROM classes c JOIN import_batches b ON b.id = c.batch_id
            WHERE b.status = 'applied' GROUP BY c.instructor_id`,
      )
      .map((row) => [row.instructorId, row.at]),
  );
  // A refused row names its instructor (class logs) or its class (attempts, streams) under the file's own
  // column names; rows of files whose columns were renamed by a mapping name neither and stay unassigned.
  const rejected = countsBy(
    db.all<{ instructorId: number | null; n: number }>(
      sql`SELECT coalesce(i.id, c.instructor_id) AS instructorId, count(*) AS n
          FROM rejected_rows r
          JOIN import_batches b ON b.id = r.batch_id AND b.status = 'applied'
          LEFT JOIN instructors i ON i.code = json_extract(r.raw, '$.instructor')
          LEFT JOIN classes c ON c.id = json_extract(r.raw, '$.class_id')
          GROUP BY 1`,
    ),
  );
  const instructors = listInstructors(db)
    .filter((instructor) => instructor.active || classes.has(instructor.id))
    .map((instructor) => ({
      instructorId: instructor.id,
      code: instructor.code,
      name: instructor.name,
      siteCode: instructor.siteCode,
      active: instructor.active,
      classes: classes.get(instructor.id) ?? 0,
      attempts: attempts.get(instructor.id)?.n ?? 0,
      lastImportAt: lastImport.get(instructor.id) ?? null,
      rejectedRows: rejected.get(instructor.id) ?? 0,
    }));
  return { quarter, instructors, unassignedRejectedRows: rejected.get(null) ?? 0 };
}
