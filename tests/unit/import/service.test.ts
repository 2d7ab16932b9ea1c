// The import service on a real SQLite file: every format, idempotency, all-or-nothing, skip-invalid, dry run,
// corrections and undo, scope, and every refusal reason with its row, column and wording.
import { describe, expect, it } from "vitest";
import { Readable } from "node:stream";
import { importFile, importFiles, safeFileName } from "../../../server/imports/service";
import { undoBatch } from "../../../server/imports/undo";
import { ATTEMPT_HEADER, count, fixture, freshDb, load } from "./helpers";

describe("class logs", () => {
  it("imports a class log (BOM stripped, extra column ignored with a warning) and creates unknown codes", async () => {
    const { db } = await freshDb();
    const s = await load(db, "classes", "classes-valid.csv");
    expect(s).toMatchObject({ status: "imported", rowsRead: 3, inserted: 3, updated: 0, unchanged: 0, rejected: 0, unit: "rows" });
    expect(s.newCodes).toEqual({ sites: ["EAST"], instructors: ["Z9"], manikins: ["MK-1", "MK-2", "MK-3"] });
    expect(s.warnings).toEqual(["Ignored column not used by classes files: room"]);
    const c1 = db.$client.prepare("SELECT * FROM classes WHERE id = 'C-001'").get() as Record<string, unknown>;
    expect(c1).toMatchObject({
      date: "2026-07-14",
      quarter: "2026-Q3",
      course: "adult",
      learners: 10,
      passed: 8,
      manikins: "MK-1;MK-2",
      lungs_replaced: 1,
      batch_id: s.batchId,
    });
    const z9 = db.$client.prepare("SELECT i.name, s.code AS site FROM instructors i JOIN sites s ON s.id = i.site_id WHERE i.code = 'Z9'").get();
    expect(z9).toEqual({ name: "Z9", site: "EAST" }); // named by the code until someone renames them
    const batch = db.$client.prepare("SELECT kind, file_name, source, rows_read, inserted, sha256 FROM import_batches WHERE id = ?").get(s.batchId);
    expect(batch).toMatchObject({ kind: "classes", file_name: "classes-valid.csv", source: "cli", rows_read: 3, inserted: 3 });
    expect((batch as { sha256: string }).sha256).toMatch(/^[0-9a-f]{64}$/);
  });

  it("reads semicolon- and tab-separated class logs as the comma file, and says which separator it used", async () => {
    for (const [file, delimiter] of [
      ["classes-semicolon.csv", "semicolon"],
      ["classes-tab.csv", "tab"],
    ] as const) {
      const { db } = await freshDb();
      const s = await load(db, "classes", file);
      expect(s, file).toMatchObject({ status: "imported", delimiter, rowsRead: 3, inserted: 3, rejected: 0 });
      // a quoted semicolon stays inside its value; a comma inside a value is no separator in these files
      const c1 = db.$client.prepare("SELECT manikins, passed FROM classes WHERE id = 'C-001'").get();
      expect(c1, file).toEqual({ manikins: "MK-1;MK-2", passed: 8 });
    }
    const { db } = await freshDb();
    expect((await load(db, "classes", "classes-valid.csv")).delimiter).toBe("comma");
  });

  it("detects the separator on the header line even when it arrives in pieces, after blank lines", async () => {
    const { db } = await freshDb();
    const text = "\n  \nclass_id;date;site;instructor;course;learners;passed;manikins\nC-9;2026-07-14;NORTH;A1;adult;4;4;MK-1\n";
    const pieces = [text.slice(0, 8), text.slice(8, 30), text.slice(30)];
    const s = await importFile(db, { kind: "classes", input: { stream: Readable.from(pieces), fileName: "pieces.csv" }, source: "cli" });
    expect(s).toMatchObject({ status: "imported", delimiter: "semicolon", rowsRead: 1, inserted: 1 });
    const empty = await importFile(db, { kind: "classes", input: { stream: Readable.from([""]), fileName: "empty.csv" }, source: "cli" });
    expect(empty).toMatchObject({ status: "refused", delimiter: null });
  });

  it("reports a re-import of the same file as unchanged, and a corrected file as one update that undo restores", async () => {
    const { db } = await freshDb();
    const first = await load(db, "classes", "classes-valid.csv");
    const again = await load(db, "classes", "classes-valid.csv");
    expect(again).toMatchObject({ status: "unchanged", batchId: null, inserted: 0, updated: 0, unchanged: 3 });
    expect(count(db, "import_batches")).toBe(1); // no empty batch record for a file that changed nothing
    expect(again.newCodes).toEqual({ sites: [], instructors: [], manikins: [] });
    const corrected = await load(db, "classes", "classes-corrected.csv");
    expect(corrected).toMatchObject({ inserted: 0, updated: 1, unchanged: 2 });
    expect(db.$client.prepare("SELECT passed, batch_id FROM classes WHERE id = 'C-001'").get()).toEqual({ passed: 9, batch_id: corrected.batchId });
    expect(count(db, "batch_changes", `batch_id = ${corrected.batchId}`)).toBe(1);

    const undo = undoBatch(db, corrected.batchId!, null);
    expect(undo).toMatchObject({ restored: 1, deleted: 0 });
    expect(db.$client.prepare("SELECT passed, batch_id FROM classes WHERE id = 'C-001'").get()).toEqual({ passed: 8, batch_id: first.batchId });
    // undoing the first batch removes its classes and the codes it created
    undoBatch(db, first.batchId!, null);
    expect(count(db, "classes")).toBe(0);
    expect(count(db, "sites", "code = 'EAST'")).toBe(0);
    expect(count(db, "sites", "code = 'NORTH'")).toBe(1); // existed before
  });

  it("moves attempts with their class when a correction changes the class's date, site or instructor", async () => {
    const { db } = await freshDb();
    await load(db, "classes", "classes-valid.csv");
    await load(db, "attempts", "attempts-valid.csv");
    const moved = await load(db, "classes", "class_id,date,site,instructor,course,learners,passed,manikins\nC-001,2026-10-02,SOUTH,B1,adult,10,8,MK-1;MK-2\n");
    expect(moved.updated).toBe(1);
    expect(db.$client.prepare("SELECT DISTINCT quarter FROM attempts WHERE class_id = 'C-001'").pluck().all()).toEqual(["2026-Q4"]);
    undoBatch(db, moved.batchId!, null);
    expect(db.$client.prepare("SELECT DISTINCT quarter FROM attempts WHERE class_id = 'C-001'").pluck().all()).toEqual(["2026-Q3"]);
  });

  it("refuses the whole file for one bad row, lists every bad row, and writes nothing", async () => {
    const { db } = await freshDb();
    const s = await load(db, "classes", "classes-bad.csv", { now: new Date("2026-12-01T12:00:00Z") });
    expect(s.status).toBe("refused");
    expect(s.batchId).toBeNull();
    expect(s.issues).toEqual([
      { row: 2, column: "class_id", reason: `"C 102" may contain only letters, digits, '.', '_' and '-'` },
      { row: 3, column: "date", reason: "2099-01-01 is in the future" },
      { row: 4, column: "date", reason: "1999-12-31 is before 2000; check the year" },
      { row: 5, column: "course", reason: `"adults" is not allowed; use one of infant, child, adult, all-ages` },
      { row: 6, column: "passed", reason: "11 passed is more than the 10 learners" },
      { row: 7, column: "learners", reason: `"ten" is not a number` },
      { row: 8, column: "learners", reason: "must be a whole number from 0 to 500; got 501" },
      { row: 9, column: "class_id", reason: "class C-101 appears more than once in this file" },
      { row: 10, column: "date", reason: `"2026-02-30" is not a date; use YYYY-MM-DD, e.g. 2026-07-14` },
      { row: 11, column: "manikins", reason: `"MK 1" is not a code: use 1–32 letters, digits, '.', '_' or '-'` },
    ]);
    expect(s.rejected).toBe(10);
    expect(count(db, "classes")).toBe(0);
    expect(count(db, "import_batches")).toBe(0);
    expect(count(db, "manikins")).toBe(0); // codes of a refused file are not created either
  });

  it("reports a missing required column once, before any row", async () => {
    const { db } = await freshDb();
    const s = await load(db, "classes", "classes-missing-column.csv");
    expect(s.status).toBe("refused");
    expect(s.issues).toEqual([{ row: null, column: "instructor", reason: `required column "instructor" is missing from the header` }]);
    expect(s.rowsRead).toBe(0);
  });

  it("says which kind a file looks like when it is given as the wrong kind", async () => {
    const { db } = await freshDb();
    const s = await load(db, "classes", "attempts-valid.csv");
    expect(s.status).toBe("refused");
    expect(s.issues).toContainEqual({ row: null, column: null, reason: "the header fits the attempts format; import it as attempts" });
  });

  it("with skipInvalid writes the valid rows and keeps the refused ones with the batch", async () => {
    const { db } = await freshDb();
    const s = await load(db, "classes", "classes-bad.csv", { skipInvalid: true, now: new Date("2026-12-01T12:00:00Z") });
    expect(s).toMatchObject({ status: "imported", inserted: 1, rejected: 10 });
    expect(count(db, "classes")).toBe(1);
    const kept = db.$client.prepare("SELECT row_number, column, reason, raw FROM rejected_rows WHERE batch_id = ? ORDER BY row_number").all(s.batchId) as {
      row_number: number;
      column: string;
      raw: string;
    }[];
    expect(kept).toHaveLength(10);
    expect(kept[0]).toMatchObject({ row_number: 2, column: "class_id" });
    expect(JSON.parse(kept[0].raw)).toMatchObject({ class_id: "C 102", date: "2026-07-02", manikins: "MK-1" });
    expect(db.$client.prepare("SELECT rejected FROM import_batches WHERE id = ?").pluck().get(s.batchId)).toBe(10);
  });

  it("with dryRun validates and counts what would change without writing anything", async () => {
    const { db } = await freshDb();
    const s = await load(db, "classes", "classes-valid.csv", { dryRun: true });
    expect(s).toMatchObject({ status: "validated", dryRun: true, inserted: 3, batchId: null });
    expect(s.newCodes.sites).toEqual(["EAST"]);
    expect(count(db, "classes") + count(db, "import_batches") + count(db, "manikins")).toBe(0);
    expect(count(db, "sites")).toBe(2);
  });

  it("refuses a row with too few values and a file that is not CSV", async () => {
    const { db } = await freshDb();
    const short = await load(db, "classes", "class_id,date,site,instructor,course,learners,passed,manikins\nC-1,2026-07-01,NORTH\n");
    expect(short.issues).toEqual([{ row: 1, column: null, reason: "the row has 3 values; the header has 8 columns" }]);
    const broken = await load(db, "classes", 'class_id,date,site,instructor,course,learners,passed,manikins\nC-1,"2026-07-01,NORTH,A1,adult,1,1,\n');
    expect(broken.status).toBe("refused");
    expect(broken.issues[0].reason).toMatch(/not readable as CSV near row 1/);
  });
});

describe("attempt summaries", () => {
  it("scores attempts with the current policy, never the device's score, and copies class values", async () => {
    const { db } = await freshDb();
    await load(db, "classes", "classes-valid.csv");
    const s = await load(db, "attempts", "attempts-valid.csv");
    expect(s).toMatchObject({ status: "imported", inserted: 4 });
    expect(s.warnings).toEqual(["Ignored column not used by attempts files: device_score"]);
    const a2 = db.$client.prepare("SELECT * FROM attempts WHERE id = 'A-002'").get() as Record<string, unknown>;
    // Score = mean of depth, rate and recoil shares on target: (40 + 50 + 95) / 3 (shared/scoring/scoreAttempt).
    expect(a2.score).toBeCloseTo(185 / 3, 12);
    expect(a2).toMatchObject({
      passed: 0,
      error_mask: 0b101,
      source: "summary",
      pauses: null,
      pauses_over10s: null,
      quarter: "2026-Q3",
      instructor_result: "fail",
      policy_version: 1,
    });
    const a4 = db.$client.prepare("SELECT manikin_id, quarter, instructor_result FROM attempts WHERE id = 'A-004'").get();
    expect(a4).toEqual({ manikin_id: null, quarter: "2026-Q3", instructor_result: "fail" });
    expect(await load(db, "attempts", "attempts-valid.csv")).toMatchObject({ inserted: 0, unchanged: 4 });
  });

  it("refuses every bad attempt row with its reason", async () => {
    const { db } = await freshDb();
    await load(db, "classes", "classes-valid.csv");
    const s = await load(db, "attempts", "attempts-bad.csv");
    expect(s.status).toBe("refused");
    expect(s.issues).toEqual([
      {
        row: 2,
        column: "learner",
        reason: `"Jane Doe" looks like a personal name (it contains a space); learners are recorded only as pseudonymous codes such as L-0042, never by name`,
      },
      { row: 3, column: "class_id", reason: "class C-999 is not in the database or in an earlier file of this import; import its class log first" },
      { row: 4, column: "rate_cpm", reason: "350 is outside 20–300 compressions per minute" },
      { row: 5, column: "depth_mm", reason: "120 is outside 0–100 mm" },
      { row: 6, column: "depth_ok_pct", reason: "depth_ok_pct + too_shallow_pct + too_deep_pct = 110; the three shares must add up to 100 (± 1)" },
      { row: 7, column: "hands_on_pct", reason: "105 is outside 0–100 %" },
      { row: 8, column: "started_at", reason: `"2026-07-14 09:37" is not a time with an offset; use ISO 8601 such as 2026-07-14T09:30:00+02:00 or …Z` },
      { row: 9, column: "duration_s", reason: "must be more than 0 seconds; got 0" },
      { row: 10, column: "feedback", reason: `"sometimes" is not allowed; use one of live, hidden` },
      { row: 10, column: "instructor_result", reason: `"maybe" is not allowed; use pass, fail or leave it empty` },
      { row: 11, column: "attempt_id", reason: "attempt B-001 appears more than once in this file" },
      { row: 12, column: "depth_mm", reason: `"5x4" is not a number` },
    ]);
    expect(s.rejected).toBe(11);
    expect(count(db, "attempts")).toBe(0);
  });

  it("accepts attempts whose classes come from an earlier file of the same command, even in a dry run", async () => {
    const { db } = await freshDb();
    // What `quarterbeat import` does for a command's files: one map of classes shared from file to file.
    const pendingClasses = new Map();
    const classes = await load(db, "classes", "classes-valid.csv", { dryRun: true, pendingClasses });
    const attempts = await load(db, "attempts", "attempts-valid.csv", { dryRun: true, pendingClasses });
    expect([classes.status, attempts.status]).toEqual(["validated", "validated"]);
    expect(attempts.inserted).toBe(4);
    expect(count(db, "attempts") + count(db, "classes")).toBe(0);
    // without the earlier file, the same attempts are refused
    expect((await load(db, "attempts", "attempts-valid.csv", { dryRun: true })).status).toBe("refused");
  });

  it("stops a command at the first refused file", async () => {
    const { db } = await freshDb();
    const result = await importFiles(db, {
      kind: "classes",
      inputs: [{ path: fixture("classes-bad.csv") }, { path: fixture("classes-valid.csv") }],
      source: "cli",
    });
    expect(result.summaries.map((s) => s.status)).toEqual(["refused"]);
    expect(result.notImported).toEqual(["classes-valid.csv"]);
  });

  it("refuses an instructor's attempts for another instructor's class, with that reason", async () => {
    const { db, people } = await freshDb();
    await load(db, "classes", "classes-valid.csv");
    const actor = { userId: people.users.instructor.id, role: "instructor" as const, instructorId: people.instructors.a1.id };
    const s = await load(db, "attempts", "attempts-valid.csv", { actor, source: "web" });
    expect(s.status).toBe("refused");
    expect(s.issues).toEqual([
      { row: 3, column: "class_id", reason: "class C-002 is another instructor's class; instructors may import attempts only for their own classes" },
      { row: 4, column: "class_id", reason: "class C-003 is another instructor's class; instructors may import attempts only for their own classes" },
    ]);
  });

  it("refuses equipment logs from anyone but a coordinator", async () => {
    const { db, people } = await freshDb();
    const actor = { userId: people.users.instructor.id, role: "instructor" as const, instructorId: people.instructors.a1.id };
    await expect(load(db, "equipment", "equipment-valid.csv", { actor })).rejects.toThrow(/coordinators only/);
  });

  it("converts units through a mapping: inches (1 in = 25.4 mm exactly) and fractions", async () => {
    // International yard and pound agreement, 1959: 1 in = 25.4 mm exactly, so 2.1 in = 53.34 mm.
    const { db } = await freshDb();
    await load(db, "classes", "classes-valid.csv");
    const csv = [
      "Run,Class,Trainee,Unit,Patient,Mode,Begin,Seconds,Count,Rate,Depth (in),Good depth,Shallow,Deep,Good rate,Slow,Fast,Full release,CCF,Max pause,Verdict",
      "X-1,C-001,L-77,MK-1,adult,on,2026-07-14T12:00:00Z,100,190,110,2.1,0.8,0.15,0.05,0.75,0.2,0.05,0.9,0.82,2.5,ok",
    ].join("\n");
    const mapping = {
      columns: {
        attempt_id: "Run",
        class_id: "Class",
        learner: "Trainee",
        manikin: "Unit",
        profile: "Patient",
        feedback: "Mode",
        started_at: "Begin",
        duration_s: "Seconds",
        compressions: "Count",
        rate_cpm: "Rate",
        depth_mm: "Depth (in)",
        depth_ok_pct: "Good depth",
        too_shallow_pct: "Shallow",
        too_deep_pct: "Deep",
        rate_ok_pct: "Good rate",
        too_slow_pct: "Slow",
        too_fast_pct: "Fast",
        recoil_ok_pct: "Full release",
        hands_on_pct: "CCF",
        longest_pause_s: "Max pause",
        instructor_result: "Verdict",
      },
      units: { depth: "in" as const, time: "ms" as const, shares: "fraction" as const },
      values: { feedback: { on: "live", off: "hidden" }, instructor_result: { ok: "pass", "not ok": "fail" } },
    };
    const s = await load(db, "attempts", csv, { mapping });
    expect(s.issues).toEqual([]);
    const row = db.$client
      .prepare("SELECT depth_mm, depth_ok_pct, too_shallow_pct, hands_on_pct, feedback, instructor_result FROM attempts WHERE id = 'X-1'")
      .get() as Record<string, number>;
    expect(row.depth_mm).toBeCloseTo(53.34, 10);
    expect(row).toMatchObject({ feedback: "live", instructor_result: "pass", depth_ok_pct: 80, hands_on_pct: 82 });
    expect(row.too_shallow_pct).toBeCloseTo(15, 10);
  });

  it("refuses a mapping naming a column the format does not have", async () => {
    const { db } = await freshDb();
    const s = await load(db, "classes", "classes-valid.csv", {
      mapping: { columns: { depth_mm: "Depth" }, units: { depth: "mm", time: "ms", shares: "percent" }, values: {} },
    });
    expect(s.status).toBe("refused");
    expect(s.issues[0]).toEqual({ row: null, column: "depth_mm", reason: `the mapping names "depth_mm", which is not a column of classes files` });
  });

  it("refuses a summary row that would replace an attempt analysed from its stream", async () => {
    const { db } = await freshDb();
    await load(db, "classes", "classes-valid.csv");
    await load(db, "compressions", "compressions-valid.csv");
    const s = await load(
      db,
      "attempts",
      `${ATTEMPT_HEADER}\nS-001,C-001,L-0201,MK-1,adult,live,2026-07-14T11:00:00+02:00,2,5,120,55,60,20,20,100,0,0,80,100,0,pass\n`,
    );
    expect(s.issues[0]).toMatchObject({ row: 1, column: "attempt_id" });
    expect(s.issues[0].reason).toMatch(/imported from its compression stream/);
  });
});

describe("equipment logs", () => {
  it("applies commissioning and retirement to the manikin, is unchanged on re-import, and undo restores the manikin", async () => {
    const { db } = await freshDb();
    await load(db, "classes", "classes-valid.csv"); // creates MK-1 without a patient type
    const s = await load(db, "equipment", "equipment-valid.csv");
    expect(s).toMatchObject({ status: "imported", inserted: 4 });
    expect(s.newCodes.manikins).toEqual(["MK-9"]);
    const mk1 = db.$client
      .prepare("SELECT m.patient_type, m.in_service_since, s.code AS site FROM manikins m JOIN sites s ON s.id = m.site_id WHERE asset_id = 'MK-1'")
      .get();
    expect(mk1).toEqual({ patient_type: "adult", in_service_since: "2026-06-01", site: "NORTH" });
    expect(db.$client.prepare("SELECT retired_on FROM manikins WHERE asset_id = 'MK-9'").pluck().get()).toBe("2026-11-30");
    expect(db.$client.prepare("SELECT quantity, note FROM equipment_events WHERE event = 'fault'").get()).toEqual({
      quantity: 1,
      note: "clicker sticks, sent for repair",
    });
    expect(await load(db, "equipment", "equipment-valid.csv")).toMatchObject({ inserted: 0, unchanged: 4 });

    undoBatch(db, s.batchId!, null);
    expect(count(db, "equipment_events")).toBe(0);
    expect(db.$client.prepare("SELECT patient_type, in_service_since FROM manikins WHERE asset_id = 'MK-1'").get()).toEqual({
      patient_type: null,
      in_service_since: null,
    });
    expect(count(db, "manikins", "asset_id = 'MK-9'")).toBe(0);
  });

  it("requires a patient type on commissioning and refuses a repeated event", async () => {
    const { db } = await freshDb();
    const s = await load(db, "equipment", "equipment-bad.csv");
    expect(s.issues).toEqual([
      { row: 1, column: "patient_type", reason: "is required when the event is commissioned (infant, child or adult)" },
      { row: 3, column: null, reason: "the same event as row 2; give one row with a quantity instead of repeating it" },
      {
        row: 4,
        column: "event",
        reason: `"exploded" is not allowed; use one of commissioned, lung_replaced, mouthpiece_cleaned, battery_replaced, serviced, fault, retired`,
      },
      { row: 5, column: "quantity", reason: "must be a whole number from 1 to 10000; got 0" },
    ]);
  });
});

describe("file names", () => {
  it("keeps only the last part of a name and replaces odd characters", () => {
    expect(safeFileName("../../etc/passwd")).toBe("passwd");
    expect(safeFileName("C:\\Users\\x\\log<1>.csv")).toBe("log_1_.csv");
    expect(safeFileName("..")).toBe("upload.csv");
  });
});
