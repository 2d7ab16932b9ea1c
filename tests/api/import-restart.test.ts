// Web uploads and import jobs across a server restart: a new server on the same database and upload folder
// answers the old ids with what happened to them (never 404), marks the jobs the stop cut short as
// interrupted, and leaves no file of the stopped server behind.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { jobSchema, type ImportJob } from "../../shared/import/api";
import type { Db } from "../../server/db/client";
import { makeTestApp, makeTestDb, seedPeople, signIn, tempDbFile, type Agent } from "../helpers/testApp";

// Jobs run in a worker thread that starts tsx on first use: allow for a busy machine.
vi.setConfig({ testTimeout: 120_000 });

const fixture = (name: string) => path.resolve("tests/fixtures/import", name);
const dbFile = tempDbFile("qb-import-restart");
let uploadDir: string;
let before: Db;
let after: Db;

beforeAll(async () => {
  uploadDir = fs.mkdtempSync(path.join(os.tmpdir(), "qb-import-restart-uploads-"));
  before = makeTestDb(dbFile);
  await seedPeople(before);
});
afterAll(() => {
  for (const db of [before, after]) if (db?.$client.open) db.$client.close();
  fs.rmSync(uploadDir, { recursive: true, force: true });
  fs.rmSync(path.dirname(dbFile), { recursive: true, force: true });
});

function upload(agent: Agent, file: string) {
  return agent.agent
    .post("/api/imports/uploads")
    .set("x-csrf-token", agent.csrfToken)
    .field("kind", "classes")
    .attach("file", file, { contentType: "text/csv" });
}

async function finished(agent: Agent, jobId: string): Promise<ImportJob> {
  for (let i = 0; i < 600; i++) {
    const job = jobSchema.parse((await agent.get(`/api/imports/jobs/${jobId}`).expect(200)).body.job);
    if (job.status === "done" || job.status === "failed") return job;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error("the job did not finish");
}

/** Every file under the folder, at any depth. */
function filesUnder(dir: string): string[] {
  return fs
    .readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((entry) => entry.isFile())
    .map((entry) => path.join(entry.parentPath, entry.name));
}

describe("uploads and import jobs across a restart", () => {
  it("answers every old id with its state, marks cut-short jobs interrupted and removes the stopped server's files", async () => {
    const first = makeTestApp(before, { uploadDir });
    const coordinator = await signIn(first, "coord@test.example");

    // a check that finished, with refused rows to download
    const checked = await upload(coordinator, fixture("classes-bad.csv")).expect(201);
    const done = await finished(coordinator, (await coordinator.post(`/api/imports/uploads/${checked.body.upload.id}/validate`, {}).expect(202)).body.job.id);
    expect(done.rejectedCsvUrl).not.toBeNull();
    await coordinator.get(done.rejectedCsvUrl!).expect(200);

    // an import still running when the server stopped: its record says so, as a killed server leaves it
    const cutShort = await upload(coordinator, fixture("classes-valid.csv")).expect(201);
    const running = await finished(coordinator, (await coordinator.post(`/api/imports/uploads/${cutShort.body.upload.id}/import`, {}).expect(202)).body.job.id);
    before.$client.prepare("UPDATE import_jobs SET status = 'running', summary = NULL, finished_at = NULL WHERE id = ?").run(running.id);
    before.$client.prepare("DELETE FROM classes").run();

    // an upload never checked
    const waiting = await upload(coordinator, fixture("classes-valid.csv")).expect(201);
    expect(filesUnder(uploadDir).length).toBeGreaterThanOrEqual(4); // three uploads and the refused rows
    before.$client.close();

    // the restart: a new server on the same database file and upload folder
    after = makeTestDb(dbFile);
    const second = makeTestApp(after, { uploadDir });
    const again = await signIn(second, "coord@test.example");

    expect(filesUnder(uploadDir)).toEqual([]);

    const doneNow = jobSchema.parse((await again.get(`/api/imports/jobs/${done.id}`).expect(200)).body.job);
    expect(doneNow).toMatchObject({ status: "done", error: null, rejectedCsvUrl: null });
    expect(doneNow.summary).toEqual(done.summary);
    const rejected = await again.get(`/api/imports/jobs/${done.id}/rejected.csv`).expect(404);
    expect(rejected.body.error.message).toMatch(/removed with its upload/);

    const interrupted = jobSchema.parse((await again.get(`/api/imports/jobs/${running.id}`).expect(200)).body.job);
    expect(interrupted).toMatchObject({ status: "interrupted", mode: "import", summary: null, rejectedCsvUrl: null });
    expect(interrupted.error).toMatch(/server restarted before this import finished\. Nothing was written/);
    expect(after.$client.prepare("SELECT status FROM import_jobs WHERE id = ?").pluck().get(running.id)).toBe("interrupted");

    for (const id of [checked.body.upload.id, cutShort.body.upload.id, waiting.body.upload.id]) {
      const gone = await again.get(`/api/imports/uploads/${id}`).expect(410);
      expect(gone.body.error).toMatchObject({ code: "upload_gone", message: "This upload was removed when the server restarted. Upload the file again." });
      await again.post(`/api/imports/uploads/${id}/validate`, {}).expect(410);
    }

    // another instructor's view is unchanged by the restart: someone else's job and upload do not exist
    const instructor = await signIn(second, "a1@test.example");
    await instructor.get(`/api/imports/jobs/${done.id}`).expect(404);
    await instructor.get(`/api/imports/uploads/${waiting.body.upload.id}`).expect(404);
    await again.get("/api/imports/jobs/0123456789abcdef01234567").expect(404);

    // the new server's own uploads work as before
    const fresh = await upload(again, fixture("classes-valid.csv")).expect(201);
    const validated = await finished(again, (await again.post(`/api/imports/uploads/${fresh.body.upload.id}/validate`, {}).expect(202)).body.job.id);
    expect(validated.summary).toMatchObject({ status: "validated", inserted: 3 });
  });
});
