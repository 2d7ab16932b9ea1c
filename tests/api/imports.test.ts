// The web import API end to end: upload, preview, validation job, import job (in a worker thread with its
// own connection), history, undo, presets, role and row scope.
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { jobSchema, previewSchema, importSummarySchema, type ImportJob } from "../../shared/import/api";
import type { Db } from "../../server/db/client";
import { makeTestApp, makeTestDb, seedPeople, signIn, type Agent, type TestApp } from "../helpers/testApp";

// Jobs run in a worker thread that starts tsx on first use: allow for a busy machine.
vi.setConfig({ testTimeout: 120_000 });

const fixture = (name: string) => path.resolve("tests/fixtures/import", name);
let db: Db;
let app: TestApp;
let coordinator: Agent;
let instructor: Agent;

beforeAll(async () => {
  db = makeTestDb();
  await seedPeople(db);
  app = makeTestApp(db);
  coordinator = await signIn(app, "coord@test.example");
  instructor = await signIn(app, "a1@test.example");
});
afterAll(() => db.$client.close());

function upload(agent: Agent, kind: string, file: string, options: { filename?: string; contentType?: string } = {}) {
  return agent.agent
    .post("/api/imports/uploads")
    .set("x-csrf-token", agent.csrfToken)
    .field("kind", kind)
    .attach("file", file, { filename: options.filename ?? path.basename(file), contentType: options.contentType ?? "text/csv" });
}

async function finished(agent: Agent, jobId: string): Promise<ImportJob> {
  for (let i = 0; i < 600; i++) {
    const res = await agent.get(`/api/imports/jobs/${jobId}`).expect(200);
    const job = jobSchema.parse(res.body.job);
    if (job.status === "done" || job.status === "failed") return job;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error("the job did not finish");
}

const count = (table: string, where = "1") => db.$client.prepare(`SELECT count(*) FROM ${table} WHERE ${where}`).pluck().get() as number;

describe("upload → preview → validate → import", () => {
  it("previews the upload with the detected columns and a suggested mapping", async () => {
    const res = await upload(coordinator, "classes", fixture("classes-valid.csv")).expect(201);
    const preview = previewSchema.parse(res.body.preview);
    expect(preview.header).toContain("class_id");
    expect(preview.rows).toHaveLength(3);
    expect(preview.problems).toEqual([]);
    expect(preview.extra).toEqual(["room"]);
    expect(preview.columns.find((c) => c.column === "instructor")?.source).toBe("instructor");
    expect(res.body.upload.fileName).toBe("classes-valid.csv");
    expect(preview.delimiter).toBe("comma");
  });

  it("previews and validates semicolon- and tab-separated uploads column by column, naming the separator", async () => {
    for (const [file, delimiter] of [
      ["classes-semicolon.csv", "semicolon"],
      ["classes-tab.csv", "tab"],
    ] as const) {
      const res = await upload(coordinator, "classes", fixture(file)).expect(201);
      const preview = previewSchema.parse(res.body.preview);
      expect(preview.delimiter, file).toBe(delimiter);
      expect(preview.header, file).toHaveLength(12);
      expect(preview.rows[0][7], file).toBe("MK-1;MK-2");
      expect(preview.problems, file).toEqual([]);
      const validate = await coordinator.post(`/api/imports/uploads/${res.body.upload.id}/validate`, {}).expect(202);
      const summary = importSummarySchema.parse((await finished(coordinator, validate.body.job.id)).summary);
      expect(summary, file).toMatchObject({ status: "validated", delimiter, inserted: 3, rejected: 0 });
    }
    expect(count("classes")).toBe(0);
  });

  it("validates as a dry-run job that writes nothing, then imports as a second job", async () => {
    const res = await upload(coordinator, "classes", fixture("classes-valid.csv")).expect(201);
    const id = res.body.upload.id;
    const validate = await coordinator.post(`/api/imports/uploads/${id}/validate`, {}).expect(202);
    const validated = await finished(coordinator, validate.body.job.id);
    const summary = importSummarySchema.parse(validated.summary);
    expect(summary).toMatchObject({ status: "validated", dryRun: true, inserted: 3, batchId: null });
    expect(summary.newCodes.sites).toEqual(["EAST"]);
    expect(count("classes")).toBe(0);
    expect(count("sites")).toBe(2);

    const run = await coordinator.post(`/api/imports/uploads/${id}/import`, {}).expect(202);
    const imported = await finished(coordinator, run.body.job.id);
    expect(imported.summary).toMatchObject({ status: "imported", inserted: 3 });
    expect(imported.progress.rows).toBe(3);
    expect(count("classes")).toBe(3);
  });

  it("reports bad rows with row, column and reason, and offers them as CSV", async () => {
    const res = await upload(coordinator, "classes", fixture("classes-bad.csv")).expect(201);
    const job = await finished(coordinator, (await coordinator.post(`/api/imports/uploads/${res.body.upload.id}/validate`, {}).expect(202)).body.job.id);
    expect(job.summary?.status).toBe("refused");
    expect(job.summary?.issues).toContainEqual({ row: 6, column: "passed", reason: "11 passed is more than the 10 learners" });
    expect(job.rejectedCsvUrl).toBe(`/api/imports/jobs/${job.id}/rejected.csv`);
    const csv = await coordinator.get(job.rejectedCsvUrl!).expect(200);
    expect(csv.headers["content-type"]).toMatch(/text\/csv/);
    const lines = csv.text.trim().split("\r\n");
    expect(lines[0]).toBe("row,column,reason,class_id,date,site,instructor,course,learners,passed,manikins");
    expect(lines).toHaveLength(1 + 10); // 10 refused rows, one reason each (row 1 is valid)
  });

  it("refuses a file that is not CSV by extension or content type", async () => {
    const byName = await upload(coordinator, "classes", fixture("classes-valid.csv"), { filename: "classes.xlsx" });
    expect(byName.status).toBe(415);
    const byType = await upload(coordinator, "classes", fixture("classes-valid.csv"), { contentType: "application/pdf" });
    expect(byType.status).toBe(415);
  });

  it("never uses the client's file name as a path", async () => {
    const res = await upload(coordinator, "classes", fixture("classes-valid.csv"), { filename: "../../etc/evil name.csv" }).expect(201);
    expect(res.body.upload.fileName).toBe("evil name.csv");
  });

  it("refuses an upload without a kind", async () => {
    const res = await coordinator.agent
      .post("/api/imports/uploads")
      .set("x-csrf-token", coordinator.csrfToken)
      .attach("file", fixture("classes-valid.csv"), { contentType: "text/csv" });
    expect(res.status).toBe(422);
  });
});

describe("roles and row scope", () => {
  it("refuses an instructor's rows that name another instructor, with that reason", async () => {
    const res = await upload(instructor, "classes", fixture("classes-valid.csv")).expect(201);
    const job = await finished(instructor, (await instructor.post(`/api/imports/uploads/${res.body.upload.id}/import`, {}).expect(202)).body.job.id);
    expect(job.summary?.status).toBe("refused");
    expect(job.summary?.issues).toContainEqual({
      row: 2,
      column: "instructor",
      reason: "B1 is not your instructor code; instructors may import only their own classes",
    });
    // row 1 (A1's class) alone would have been fine: nothing at all was written
    expect(job.summary?.issues.map((i) => i.row)).toEqual([2, 3]);
  });

  it("refuses an instructor's upload that names a new site or manikin, or another site, and creates no code", async () => {
    const sites = count("sites");
    const manikins = count("manikins");
    const res = await instructor.agent
      .post("/api/imports/uploads")
      .set("x-csrf-token", instructor.csrfToken)
      .field("kind", "classes")
      .attach(
        "file",
        Buffer.from(
          "class_id,date,site,instructor,course,learners,passed,manikins\nC-A1-20,2026-09-01,EVILSITE,A1,adult,4,4,\nC-A1-21,2026-09-01,SOUTH,A1,adult,4,4,\nC-A1-22,2026-09-01,NORTH,A1,adult,4,4,EVIL-M1\n",
        ),
        { filename: "evil.csv", contentType: "text/csv" },
      )
      .expect(201);
    const job = await finished(instructor, (await instructor.post(`/api/imports/uploads/${res.body.upload.id}/import`, {}).expect(202)).body.job.id);
    expect(job.summary).toMatchObject({ status: "refused", file: "evil.csv" });
    expect(job.summary?.issues.map((i) => [i.row, i.column])).toEqual([
      [1, "site"],
      [2, "site"],
      [3, "manikins"],
    ]);
    expect(count("sites")).toBe(sites);
    expect(count("manikins")).toBe(manikins);
  });

  it("keeps equipment imports for coordinators", async () => {
    const res = await upload(instructor, "equipment", fixture("equipment-valid.csv"));
    expect(res.status).toBe(403);
  });

  it("keeps the import pages from funders and quality leads", async () => {
    const funder = await signIn(app, "funder@test.example");
    await funder.get("/api/imports/batches").expect(403);
    const quality = await signIn(app, "quality@test.example");
    await quality.get("/api/imports/presets").expect(403);
  });

  it("lets an instructor import their own class and see only their own batches", async () => {
    const res = await instructor.agent
      .post("/api/imports/uploads")
      .set("x-csrf-token", instructor.csrfToken)
      .field("kind", "classes")
      .attach("file", Buffer.from("class_id,date,site,instructor,course,learners,passed,manikins\nC-A1-9,2026-09-01,NORTH,A1,adult,4,4,\n"), {
        filename: "mine.csv",
        contentType: "text/csv",
      })
      .expect(201);
    const job = await finished(instructor, (await instructor.post(`/api/imports/uploads/${res.body.upload.id}/import`, {}).expect(202)).body.job.id);
    expect(job.summary?.status).toBe("imported");
    const own = await instructor.get("/api/imports/batches").expect(200);
    expect(own.body.batches.map((b: { fileName: string }) => b.fileName)).toEqual(["mine.csv"]);
    const all = await coordinator.get("/api/imports/batches").expect(200);
    expect(all.body.total).toBeGreaterThan(own.body.total);
    expect(all.body.batches[0]).toMatchObject({ fileName: "mine.csv", userEmail: "a1@test.example", source: "web", kind: "classes" });
  });

  it("does not show another user's upload or job", async () => {
    const res = await upload(coordinator, "classes", fixture("classes-valid.csv")).expect(201);
    await instructor.get(`/api/imports/uploads/${res.body.upload.id}`).expect(404);
  });
});

describe("undo and history", () => {
  it("undoes a batch for a coordinator only, and refuses a second undo", async () => {
    const res = await upload(coordinator, "equipment", fixture("equipment-valid.csv")).expect(201);
    const job = await finished(coordinator, (await coordinator.post(`/api/imports/uploads/${res.body.upload.id}/import`, {}).expect(202)).body.job.id);
    const batchId = job.summary!.batchId!;
    expect(count("equipment_events")).toBe(4);
    await instructor.post(`/api/imports/batches/${batchId}/undo`).expect(403);
    const undo = await coordinator.post(`/api/imports/batches/${batchId}/undo`).expect(200);
    expect(undo.body).toMatchObject({ batch: { id: batchId, status: "undone" }, deleted: 4 });
    expect(count("equipment_events")).toBe(0);
    const again = await coordinator.post(`/api/imports/batches/${batchId}/undo`).expect(409);
    expect(again.body.error.message).toMatch(/already been undone/);
  });

  it("refuses to undo a class log whose classes have attempts from another batch, naming that batch", async () => {
    const classes = await upload(coordinator, "classes", fixture("classes-corrected.csv")).expect(201);
    const classJob = await finished(coordinator, (await coordinator.post(`/api/imports/uploads/${classes.body.upload.id}/import`, {}).expect(202)).body.job.id);
    // the classes exist from an earlier test: this batch updated C-001 (passed 8 → 9)
    expect(classJob.summary).toMatchObject({ status: "imported", updated: 1, unchanged: 2 });
    const attempts = await upload(coordinator, "attempts", fixture("attempts-valid.csv")).expect(201);
    const attemptJob = await finished(
      coordinator,
      (await coordinator.post(`/api/imports/uploads/${attempts.body.upload.id}/import`, {}).expect(202)).body.job.id,
    );
    expect(attemptJob.summary).toMatchObject({ status: "imported", inserted: 4 });

    // the first classes batch inserted the classes; the attempts batch now depends on it
    const list = await coordinator.get("/api/imports/batches?kind=classes").expect(200);
    const first = list.body.batches.find((b: { fileName: string; inserted: number }) => b.fileName === "classes-valid.csv" && b.inserted === 3);
    const refused = await coordinator.post(`/api/imports/batches/${first.id}/undo`).expect(409);
    expect(refused.body.error.message).toContain(`batch ${classJob.summary!.batchId}`);

    const detail = await coordinator.get(`/api/imports/batches/${attemptJob.summary!.batchId}`).expect(200);
    expect(detail.body.batch).toMatchObject({ kind: "attempts", inserted: 4, status: "applied" });
  });
});

describe("mapping presets", () => {
  it("creates, lists, uses and deletes a preset", async () => {
    const mapping = {
      columns: { attempt_id: "Run", t_ms: "Time (s)", depth_mm: "Depth (cm)", release_mm: "Residual (cm)" },
      units: { depth: "cm", time: "s" },
    };
    const created = await instructor.post("/api/imports/presets", { name: "Pulse-trainer export", kind: "compressions", mapping }).expect(201);
    expect(created.body.preset.mapping.units).toEqual({ depth: "cm", time: "s", shares: "percent" });
    await instructor.post("/api/imports/presets", { name: "Pulse-trainer export", kind: "compressions", mapping }).expect(409);
    await instructor.post("/api/imports/presets", { name: "Wrong", kind: "classes", mapping }).expect(422);
    const list = await coordinator.get("/api/imports/presets?kind=compressions").expect(200);
    expect(list.body.presets.map((p: { name: string }) => p.name)).toEqual(["Pulse-trainer export"]);

    const res = await upload(coordinator, "classes", fixture("classes-valid.csv")).expect(201);
    const wrongKind = await coordinator.post(`/api/imports/uploads/${res.body.upload.id}/preview`, { presetId: created.body.preset.id });
    expect(wrongKind.status).toBe(400);

    const other = await signIn(app, "b1@test.example");
    await other.delete(`/api/imports/presets/${created.body.preset.id}`).expect(403);
    await instructor.delete(`/api/imports/presets/${created.body.preset.id}`).expect(204);
  });
});

describe("the server stays responsive during an import", () => {
  it("answers reads and writes of other requests while a worker imports a file", async () => {
    const header =
      "attempt_id,class_id,learner,manikin,profile,feedback,started_at,duration_s,compressions,rate_cpm,depth_mm,depth_ok_pct,too_shallow_pct,too_deep_pct,rate_ok_pct,too_slow_pct,too_fast_pct,recoil_ok_pct,hands_on_pct,longest_pause_s,instructor_result";
    const lines = [header];
    for (let i = 0; i < 10_000; i++) lines.push(`W-${i},C-001,L-${i},MK-1,adult,live,2026-07-14T09:30:00Z,120,230,112,54,85,10,5,80,12,8,90,85,4,`);
    const res = await coordinator.agent
      .post("/api/imports/uploads")
      .set("x-csrf-token", coordinator.csrfToken)
      .field("kind", "attempts")
      .attach("file", Buffer.from(lines.join("\n")), { filename: "big.csv", contentType: "text/csv" })
      .expect(201);
    const start = await coordinator.post(`/api/imports/uploads/${res.body.upload.id}/import`, {}).expect(202);
    // Reads go on during the import (WAL); a write waits for the import's commit (busy_timeout), then succeeds.
    await coordinator.get("/api/imports/batches").expect(200);
    const site = await coordinator.post("/api/sites", { code: "WEST", name: "Westbrook Rooms" });
    expect(site.status).toBe(201);
    const job = await finished(coordinator, start.body.job.id);
    expect(job.summary).toMatchObject({ status: "imported", inserted: 10_000 });
    expect(count("sites", "code = 'WEST'")).toBe(1);
  });
});
