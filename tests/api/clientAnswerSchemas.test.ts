// The client checks every answer against a shared schema (src/api/getParsed.ts) and refuses one that does
// not fit. These are the answers whose schemas no other API test holds the server to: if one drifted, the
// page reading it would show an error instead of its data.
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import {
  batchDetailResponseSchema,
  batchListResponseSchema,
  formatsResponseSchema,
  jobResponseSchema,
  presetListResponseSchema,
} from "../../shared/import/api";
import { sessionAnswerSchema } from "../../shared/schemas/auth";
import { dataVersionAnswerSchema } from "../../shared/schemas/dataVersion";
import { optionsAnswerSchema } from "../../shared/schemas/insight";
import { instructorListAnswerSchema, siteListAnswerSchema } from "../../shared/schemas/sites";
import { userListAnswerSchema } from "../../shared/schemas/users";
import type { Db } from "../../server/db/client";
import { makeTestApp, makeTestDb, seedPeople, signIn, type Agent, type TestApp } from "../helpers/testApp";

// The import job runs in a worker thread that starts tsx on first use: allow for a busy machine.
vi.setConfig({ testTimeout: 120_000 });

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

async function importedJob(agent: Agent) {
  const file = path.resolve("tests/fixtures/import/classes-valid.csv");
  const uploaded = await agent.agent
    .post("/api/imports/uploads")
    .set("x-csrf-token", agent.csrfToken)
    .field("kind", "classes")
    .attach("file", file, { contentType: "text/csv" })
    .expect(201);
  const started = await agent.post(`/api/imports/uploads/${uploaded.body.upload.id}/import`, {}).expect(202);
  for (let i = 0; i < 600; i++) {
    const job = jobResponseSchema.parse((await agent.get(`/api/imports/jobs/${started.body.job.id}`).expect(200)).body).job;
    if (job.status === "done" || job.status === "failed") return job;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error("the import job did not finish");
}

describe("answers fit the schemas the client parses them with", () => {
  it("session, data version and filter options", async () => {
    expect(sessionAnswerSchema.parse((await instructor.get("/api/me").expect(200)).body).user.role).toBe("instructor");
    expect(dataVersionAnswerSchema.parse((await instructor.get("/api/data-version").expect(200)).body).version).not.toBe("");
    expect(optionsAnswerSchema.parse((await instructor.get("/api/insight/options").expect(200)).body).quarters).toEqual([]);
  });

  it("users, sites and instructors", async () => {
    expect(userListAnswerSchema.parse((await coordinator.get("/api/users").expect(200)).body).users.length).toBeGreaterThan(1);
    expect(siteListAnswerSchema.parse((await coordinator.get("/api/sites").expect(200)).body).sites.map((s) => s.code)).toEqual(["NORTH", "SOUTH"]);
    expect(instructorListAnswerSchema.parse((await coordinator.get("/api/instructors").expect(200)).body).instructors.length).toBeGreaterThan(1);
  });

  it("import formats, presets, history, one batch and a job", async () => {
    const formats = formatsResponseSchema.parse((await coordinator.get("/api/imports/formats").expect(200)).body).formats;
    expect(formats.classes.some((column) => column.required)).toBe(true);
    const mapping = { columns: {}, units: {} };
    await coordinator.post("/api/imports/presets", { name: "As exported", kind: "classes", mapping }).expect(201);
    expect(presetListResponseSchema.parse((await coordinator.get("/api/imports/presets?kind=classes").expect(200)).body).presets.map((p) => p.name)).toEqual([
      "As exported",
    ]);

    const job = await importedJob(coordinator);
    expect(job.status).toBe("done");
    const history = batchListResponseSchema.parse((await coordinator.get("/api/imports/batches?limit=25&offset=0").expect(200)).body);
    expect(history.total).toBe(1);
    const detail = batchDetailResponseSchema.parse((await coordinator.get(`/api/imports/batches/${history.batches[0].id}`).expect(200)).body);
    expect(detail.batch.id).toBe(job.summary?.batchId);
  });
});
