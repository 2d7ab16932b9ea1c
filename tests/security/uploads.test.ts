// Upload limits: size, type, and the client's file name, which must never act as a path.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../server/db/client";
import { MAX_UPLOAD_BYTES } from "../../server/imports/routes";
import { makeTestApp, makeTestDb, seedPeople, signIn, type Agent, type TestApp } from "../helpers/testApp";

const CLASSES_CSV = "class_id,date,site,instructor,course,learners,passed,manikins\nC-UP-1,2026-05-04,NORTH,A1,adult,6,5,\n";

let db: Db;
let app: TestApp;
let coordinator: Agent;
/** The temp folder the app was built under: its upload folder is inside, and nothing else may appear there. */
let tmpRoot: string;
let uploadDir: string;
let workDir: string;

function listFiles(dir: string): string[] {
  return fs
    .readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => path.join(e.parentPath, e.name));
}

beforeAll(async () => {
  tmpRoot = fs.mkdtempSync(path.join(os.tmpdir(), "qb-sec-uploads-"));
  workDir = path.join(tmpRoot, "a", "b", "c");
  fs.mkdirSync(workDir, { recursive: true });
  db = makeTestDb();
  await seedPeople(db);
  const savedTmp = process.env.TMPDIR;
  process.env.TMPDIR = workDir; // the upload store makes its folder under os.tmpdir()
  try {
    app = makeTestApp(db);
  } finally {
    if (savedTmp === undefined) delete process.env.TMPDIR;
    else process.env.TMPDIR = savedTmp;
  }
  const made = fs.readdirSync(workDir).filter((name) => name.startsWith("quarterbeat-uploads-"));
  expect(made).toHaveLength(1);
  uploadDir = path.join(workDir, made[0]);
  coordinator = await signIn(app, "coord@test.example");
});
afterAll(() => {
  db.$client.close();
  fs.rmSync(tmpRoot, { recursive: true, force: true });
});

function upload(body: Buffer | string, filename: string, contentType = "text/csv", kind = "classes") {
  return coordinator.agent
    .post("/api/imports/uploads")
    .set("x-csrf-token", coordinator.csrfToken)
    .field("kind", kind)
    .attach("file", Buffer.isBuffer(body) ? body : Buffer.from(body), { filename, contentType });
}

async function finished(jobId: string) {
  for (let i = 0; i < 600; i++) {
    const res = await coordinator.get(`/api/imports/jobs/${jobId}`).expect(200);
    if (res.body.job.status === "done" || res.body.job.status === "failed") return res.body.job;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error("the job did not finish");
}

describe("size limit", () => {
  it("refuses a file over the limit with 413, says the limit, and keeps no part of it", async () => {
    const before = listFiles(uploadDir).length;
    const header = "class_id,date,site,instructor,course,learners,passed,manikins\n";
    const big = Buffer.alloc(MAX_UPLOAD_BYTES + 1024, "x");
    big.write(header);
    const res = await upload(big, "huge.csv");
    expect(res.status).toBe(413);
    expect(res.headers["content-type"]).toMatch(/application\/json/);
    expect(res.body.error.code).toBe("too_large");
    expect(res.body.error.message).toContain(`${MAX_UPLOAD_BYTES / 1024 / 1024} MB`);
    expect(listFiles(uploadDir)).toHaveLength(before);
  });

  it("refuses a JSON body over its limit with 413 and a message", async () => {
    const res = await coordinator.post("/api/sites", { code: "BIG", name: "x".repeat(2 * 1024 * 1024) });
    expect(res.status).toBe(413);
    expect(res.body.error.message).toMatch(/larger than/);
  });
});

describe("file type", () => {
  it.each([
    { filename: "classes.xlsx", contentType: "text/csv" },
    { filename: "classes.csv.exe", contentType: "text/csv" },
    { filename: "classes", contentType: "text/csv" },
    { filename: "classes.csv", contentType: "application/pdf" },
    { filename: "classes.csv", contentType: "text/html" },
    { filename: "classes.csv", contentType: "application/x-msdownload" },
  ])("refuses $filename sent as $contentType with 415 and a message saying only CSV files are imported", async ({ filename, contentType }) => {
    const before = listFiles(uploadDir).length;
    const res = await upload(CLASSES_CSV, filename, contentType);
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe("unsupported_file");
    expect(res.body.error.message).toMatch(/Only CSV files/);
    expect(listFiles(uploadDir)).toHaveLength(before);
  });

  it("takes a .csv file whose bytes are not text without crashing: the validation refuses it with a reason", async () => {
    const garbage = Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 7919) % 256));
    const res = await upload(garbage, "binary.csv");
    expect(res.status).toBe(201);
    const start = await coordinator.post(`/api/imports/uploads/${res.body.upload.id}/validate`).expect(202);
    const job = await finished(start.body.job.id);
    expect(job.status).toBe("done");
    expect(job.summary.status).toBe("refused");
    expect(job.summary.issues.length).toBeGreaterThan(0);
  });
});

describe("the client's file name", () => {
  const hostile = [
    { sent: "../../etc/passwd.csv", recorded: "passwd.csv", escape: "passwd.csv" },
    { sent: "..\\..\\x.csv", recorded: "x.csv", escape: "x.csv" },
    { sent: "/tmp/absolute-qb-sec.csv", recorded: "absolute-qb-sec.csv", escape: "absolute-qb-sec.csv" },
    { sent: "..%2F..%2Fencoded.csv", recorded: "..%2F..%2Fencoded.csv".replace(/%/g, "_"), escape: "encoded.csv" },
  ];

  it.each(hostile)("stores $sent inside the upload folder only and records it as $recorded", async ({ sent, recorded, escape }) => {
    const outside = () => listFiles(tmpRoot).filter((f) => !f.startsWith(uploadDir + path.sep));
    const outsideBefore = outside();
    // a class of its own per case: a file that changes nothing records no batch
    const res = await upload(CLASSES_CSV.replace("C-UP-1", `C-UP-${hostile.findIndex((h) => h.sent === sent) + 10}`), sent);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.upload.fileName).toBe(recorded);

    // nothing new outside the upload folder, nowhere the name could point to
    expect(outside()).toEqual(outsideBefore);
    for (const base of [uploadDir, workDir, process.cwd()]) {
      expect(fs.existsSync(path.resolve(base, sent.replace(/\\/g, "/")))).toBe(false);
    }
    expect(fs.existsSync(path.join("/etc", escape))).toBe(false);
    // inside the folder only random names
    for (const file of listFiles(uploadDir)) expect(path.basename(file)).toMatch(/^[0-9a-f]{32}\.csv/);

    // the batch records the cleaned name
    const start = await coordinator.post(`/api/imports/uploads/${res.body.upload.id}/import`).expect(202);
    const job = await finished(start.body.job.id);
    expect(job.summary.status, JSON.stringify(job.summary)).toBe("imported");
    const batch = await coordinator.get(`/api/imports/batches/${job.summary.batchId}`).expect(200);
    expect(batch.body.batch.fileName).toBe(recorded);
    const stored = db.$client.prepare("SELECT file_name FROM import_batches WHERE id = ?").pluck().get(job.summary.batchId);
    expect(stored).toBe(recorded);
    expect(String(stored)).not.toMatch(/[\\/]/);
    expect(["", ".", ".."]).not.toContain(stored);
  });
});
