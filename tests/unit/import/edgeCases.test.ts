// Input at the edges: value mappings read as own keys only, empty and header-only files, a re-import that
// changes nothing, and the upper bounds on duration_s and started_at. Each refusal names row, column, reason.
import { Readable } from "node:stream";
import { describe, expect, it } from "vitest";
import { importMappingSchema } from "../../../shared/import/mapping";
import { importFile } from "../../../server/imports/service";
import { ATTEMPT_HEADER, count, freshDb, load, STREAM_HEADER } from "./helpers";

const CLASS_HEADER = "class_id,date,site,instructor,course,learners,passed,manikins";
const CLASS_ROW = "C-001,2026-07-14,NORTH,A1,adult,10,8,MK-1";
const NOW = new Date("2026-12-01T12:00:00Z");

/** An attempt of class C-001 (dated 2026-07-14) with the given feedback, manikin, start and duration. */
function attempt(id: string, { feedback = "live", manikin = "MK-1", startedAt = "2026-07-14T09:30:00Z", duration = "120" } = {}) {
  return `${id},C-001,L-1,${manikin},adult,${feedback},${startedAt},${duration},230,112,54,85,10,5,80,12,8,90,85,4,`;
}

async function withClass() {
  const { db } = await freshDb();
  await load(db, "classes", `${CLASS_HEADER}\n${CLASS_ROW}\n`);
  return db;
}

describe("value mappings", () => {
  const mapping = importMappingSchema.parse({ values: { feedback: { on: "live", constructor: "hidden" }, manikin: { "old-1": "MK-1" } } });

  it("refuses a file value named like a built-in property (toString, __proto__) as an ordinary unknown value", async () => {
    const db = await withClass();
    const csv = [
      ATTEMPT_HEADER,
      attempt("A-1", { feedback: "toString" }),
      attempt("A-2", { feedback: "__proto__" }),
      attempt("A-3", { feedback: "hasOwnProperty" }),
    ].join("\n");
    const s = await load(db, "attempts", csv, { mapping });
    expect(s.status).toBe("refused");
    expect(s.issues).toEqual([
      { row: 1, column: "feedback", reason: `"toString" is not allowed; use one of live, hidden` },
      { row: 2, column: "feedback", reason: `"__proto__" is not allowed; use one of live, hidden` },
      { row: 3, column: "feedback", reason: `"hasOwnProperty" is not allowed; use one of live, hidden` },
    ]);
  });

  it("translates a mapping key named like a built-in property as any other key, and keeps unmapped values as they are", async () => {
    const db = await withClass();
    const csv = [
      ATTEMPT_HEADER,
      attempt("A-1", { feedback: "constructor" }),
      attempt("A-2", { feedback: "on", manikin: "toString" }),
      attempt("A-3", { manikin: "old-1" }),
    ].join("\n");
    const s = await load(db, "attempts", csv, { mapping });
    expect(s).toMatchObject({ status: "imported", inserted: 3 });
    const stored = db.$client.prepare("SELECT a.id, a.feedback, m.asset_id FROM attempts a JOIN manikins m ON m.id = a.manikin_id ORDER BY a.id").all();
    expect(stored).toEqual([
      { id: "A-1", feedback: "hidden", asset_id: "MK-1" },
      { id: "A-2", feedback: "live", asset_id: "toString" },
      { id: "A-3", feedback: "live", asset_id: "MK-1" },
    ]);
  });

  it("refuses a column mapping that names a built-in property instead of a column", async () => {
    const { db } = await freshDb();
    const s = await load(db, "classes", `${CLASS_HEADER}\n${CLASS_ROW}\n`, { mapping: importMappingSchema.parse({ columns: { toString: "date" } }) });
    expect(s.status).toBe("refused");
    expect(s.issues).toContainEqual({ row: null, column: "toString", reason: `the mapping names "toString", which is not a column of classes files` });
  });
});

describe("empty and header-only files", () => {
  it.each([
    ["nothing at all", ""],
    ["only a byte-order mark", "\uFEFF"],
    ["only blank lines", "\n\n\r\n"],
    ["only lines of spaces", "  \n\t\n"],
  ])("says the file is empty, once, for %s", async (_what, text) => {
    const { db } = await freshDb();
    for (const kind of ["classes", "attempts", "compressions", "equipment"] as const) {
      const s = await importFile(db, { kind, input: { stream: Readable.from([text]), fileName: "empty.csv" }, source: "cli" });
      expect(s.status).toBe("refused");
      expect(s.issues, JSON.stringify(text)).toEqual([{ row: null, column: null, reason: "the file is empty" }]);
    }
    expect(count(db, "import_batches")).toBe(0);
  });

  it("refuses a first row of empty names with one message", async () => {
    const { db } = await freshDb();
    const s = await load(db, "classes", ",,,\nC-001,2026-07-14,NORTH,A1\n");
    expect(s.issues).toEqual([{ row: null, column: null, reason: "the first row has no column names; the file must start with its header row" }]);
  });

  it("refuses a header without rows instead of recording an empty batch", async () => {
    const { db } = await freshDb();
    const s = await load(db, "classes", `${CLASS_HEADER}\n\n`);
    expect(s).toMatchObject({ status: "refused", batchId: null, rowsRead: 0 });
    expect(s.issues).toEqual([{ row: null, column: null, reason: "the file has a header but no rows" }]);
    expect(count(db, "import_batches")).toBe(0);
    const dry = await load(db, "classes", `${CLASS_HEADER}\n`, { dryRun: true });
    expect(dry.status).toBe("refused");
  });
});

describe("a re-import that changes nothing", () => {
  it("records no batch and says nothing changed, for every kind", async () => {
    const { db } = await freshDb();
    const files = {
      classes: `${CLASS_HEADER}\n${CLASS_ROW}\n`,
      attempts: `${ATTEMPT_HEADER}\n${attempt("A-1")}\n`,
      compressions: [STREAM_HEADER, ...[0, 500, 1000].map((t) => `S-1,C-001,L-2,MK-1,adult,live,2026-07-14T11:00:00Z,,${t},55,0`)].join("\n"),
      equipment: "date,manikin,site,event,quantity,patient_type,note\n2026-06-01,MK-1,NORTH,commissioned,,adult,new torso\n",
    };
    for (const [kind, csv] of Object.entries(files) as [keyof typeof files, string][]) {
      expect((await load(db, kind, csv)).status, kind).toBe("imported");
      const batches = count(db, "import_batches");
      const again = await load(db, kind, csv);
      expect(again, kind).toMatchObject({ status: "unchanged", batchId: null, inserted: 0, updated: 0, unchanged: 1 });
      expect(count(db, "import_batches"), kind).toBe(batches);
    }
  });

  it("still records a batch when --skip-invalid keeps refused rows to fix, even if no row changed", async () => {
    const db = await withClass();
    const s = await load(db, "classes", `${CLASS_HEADER}\n${CLASS_ROW}\nC-002,2026-07-14,NORTH,A1,adult,10,11,\n`, { skipInvalid: true });
    expect(s).toMatchObject({ status: "imported", unchanged: 1, rejected: 1 });
    expect(s.batchId).not.toBeNull();
    expect(count(db, "rejected_rows", `batch_id = ${s.batchId}`)).toBe(1);
  });
});

describe("upper bounds", () => {
  it("takes a duration of up to an hour and refuses a longer one, naming row and column", async () => {
    const db = await withClass();
    const csv = [ATTEMPT_HEADER, attempt("A-1", { duration: "3600" }), attempt("A-2", { duration: "3600.5" }), attempt("A-3", { duration: "1e308" })].join(
      "\n",
    );
    const s = await load(db, "attempts", csv);
    expect(s.issues).toEqual([
      { row: 2, column: "duration_s", reason: "must be at most 3600 seconds; got 3600.5" },
      { row: 3, column: "duration_s", reason: "must be at most 3600 seconds; got 1e308" },
    ]);
  });

  it("takes a start within a day of the class date, in the start's own offset, and refuses one further off", async () => {
    const db = await withClass(); // class C-001 is dated 2026-07-14
    const csv = [
      ATTEMPT_HEADER,
      attempt("A-1", { startedAt: "2026-07-13T23:30:00-04:00" }), // the evening before, local time
      attempt("A-2", { startedAt: "2026-07-15T00:30:00+02:00" }), // past midnight
      attempt("A-3", { startedAt: "2001-07-14T09:30:00Z" }),
      attempt("A-4", { startedAt: "2026-07-16T09:30:00+02:00" }),
      attempt("A-5", { startedAt: "2026-07-12T23:59:00Z" }),
    ].join("\n");
    const s = await load(db, "attempts", csv, { now: NOW });
    expect(s.issues).toEqual([
      {
        row: 3,
        column: "started_at",
        reason: "2001-07-14T09:30:00Z is 9131 days before the class date 2026-07-14; an attempt must start within 1 day of its class's date",
      },
      {
        row: 4,
        column: "started_at",
        reason: "2026-07-16T09:30:00+02:00 is 2 days after the class date 2026-07-14; an attempt must start within 1 day of its class's date",
      },
      {
        row: 5,
        column: "started_at",
        reason: "2026-07-12T23:59:00Z is 2 days before the class date 2026-07-14; an attempt must start within 1 day of its class's date",
      },
    ]);
  });

  it("applies the same start rule to a compression stream", async () => {
    const db = await withClass();
    const rows = [0, 500, 1000].map((t) => `S-1,C-001,L-2,MK-1,adult,live,2001-07-14T11:00:00Z,,${t},55,0`);
    const s = await load(db, "compressions", [STREAM_HEADER, ...rows].join("\n"));
    expect(s.status).toBe("refused");
    expect(s.issues[0]).toMatchObject({ row: 1, column: "started_at" });
  });

  it("checks the start against a class from an earlier file of the same dry-run command", async () => {
    const { db } = await freshDb();
    const pendingClasses = new Map();
    await load(db, "classes", `${CLASS_HEADER}\n${CLASS_ROW}\n`, { dryRun: true, pendingClasses });
    const s = await load(db, "attempts", `${ATTEMPT_HEADER}\n${attempt("A-1", { startedAt: "2026-08-14T09:30:00Z" })}\n`, { dryRun: true, pendingClasses });
    expect(s.issues.map((i) => i.column)).toEqual(["started_at"]);
  });
});
