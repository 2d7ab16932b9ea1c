// A web upload and a CLI import of the same database file at the same time: SQLite lets one writer in at a
// time, so one waits for the other; both must finish and every row of both files must be there. Also when
// the other writer keeps the lock for longer than one busy timeout (15 s).
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import Database from "better-sqlite3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDatabase, type Db } from "../../server/db/client";
import { makeTestApp, seedPeople, signIn, tempDbFile, type Agent, type TestApp } from "../helpers/testApp";
import { CLASSES_FIXTURE, countRows, runCli, sleep, startCli, waitFor, writeAttemptsFile, writeLockHeld } from "./helpers";

const CLI_ROWS = 40_000;
const WEB_ROWS = 15_000;

let dbFile: string;
let db: Db;
let app: TestApp;
let coordinator: Agent;
let dir: string;

beforeAll(async () => {
  dbFile = tempDbFile("qb-fault-concurrent");
  db = openDatabase(dbFile);
  await seedPeople(db);
  app = makeTestApp(db);
  coordinator = await signIn(app, "coord@test.example");
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "qb-fault-concurrent-files-"));
  const classes = await runCli(dbFile, ["import", "classes", CLASSES_FIXTURE]);
  expect(classes.code, classes.stderr).toBe(0);
}, 120_000);
afterAll(() => {
  db.$client.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

async function startWebImport(file: string): Promise<string> {
  const up = await coordinator.agent
    .post("/api/imports/uploads")
    .set("x-csrf-token", coordinator.csrfToken)
    .field("kind", "attempts")
    .attach("file", file, { filename: path.basename(file), contentType: "text/csv" });
  expect(up.status, up.text).toBe(201);
  const start = await coordinator.post(`/api/imports/uploads/${up.body.upload.id}/import`).expect(202);
  return start.body.job.id as string;
}

async function jobResult(jobId: string, timeoutMs = 280_000) {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    const res = await coordinator.get(`/api/imports/jobs/${jobId}`).expect(200);
    if (res.body.job.status === "done" || res.body.job.status === "failed") return res.body.job;
    await sleep(200);
  }
  throw new Error("the web import did not finish");
}

const count = (prefix: string) => countRows(dbFile, "SELECT count(*) FROM attempts WHERE id LIKE ?", `${prefix}-%`);

function expectHealthy() {
  const check = new Database(dbFile, { readonly: true });
  try {
    expect(check.prepare("PRAGMA integrity_check").pluck().get()).toBe("ok");
    expect(check.prepare("PRAGMA foreign_key_check").all()).toEqual([]);
  } finally {
    check.close();
  }
}

describe("a web upload and a CLI import at the same time", () => {
  it("CLI first, web upload while it writes: both finish, every row of both is there", { timeout: 300_000 }, async () => {
    const cliFile = writeAttemptsFile(path.join(dir, "cli-1.csv"), "CLI1", CLI_ROWS);
    const webFile = writeAttemptsFile(path.join(dir, "web-1.csv"), "WEB1", WEB_ROWS);
    const totalBefore = countRows(dbFile, "SELECT count(*) FROM attempts");

    const cli = startCli(dbFile, ["import", "attempts", cliFile, "--json"]);
    const writing = await waitFor(() => cli.child.exitCode !== null || writeLockHeld(dbFile), 120_000);
    expect(writing).toBe(true);
    const jobId = await startWebImport(webFile);
    // the server keeps answering reads while both imports are under way
    await coordinator.get("/api/imports/batches").expect(200);

    const [cliResult, job] = await Promise.all([cli.done, jobResult(jobId)]);
    expect(cliResult.code, cliResult.stderr).toBe(0);
    expect(JSON.parse(cliResult.stdout).files[0]).toMatchObject({ status: "imported", inserted: CLI_ROWS });
    expect(job.error).toBeNull();
    expect(job.summary).toMatchObject({ status: "imported", inserted: WEB_ROWS });

    expect(count("CLI1")).toBe(CLI_ROWS);
    expect(count("WEB1")).toBe(WEB_ROWS);
    expect(countRows(dbFile, "SELECT count(*) FROM attempts")).toBe(totalBefore + CLI_ROWS + WEB_ROWS);
    expect(countRows(dbFile, "SELECT count(*) FROM import_batches WHERE kind = 'attempts' AND status = 'applied'")).toBe(2);
    expectHealthy();
  });

  it("web upload first, CLI while it writes: both finish, every row of both is there", { timeout: 300_000 }, async () => {
    const webFile = writeAttemptsFile(path.join(dir, "web-2.csv"), "WEB2", CLI_ROWS);
    const cliFile = writeAttemptsFile(path.join(dir, "cli-2.csv"), "CLI2", WEB_ROWS);
    const totalBefore = countRows(dbFile, "SELECT count(*) FROM attempts");

    const jobId = await startWebImport(webFile);
    const writing = await waitFor(() => writeLockHeld(dbFile), 120_000);
    expect(writing).toBe(true);
    const cli = startCli(dbFile, ["import", "attempts", cliFile, "--json"]);

    const [cliResult, job] = await Promise.all([cli.done, jobResult(jobId)]);
    expect(job.error).toBeNull();
    expect(job.summary).toMatchObject({ status: "imported", inserted: CLI_ROWS });
    expect(cliResult.code, cliResult.stderr).toBe(0);
    expect(JSON.parse(cliResult.stdout).files[0]).toMatchObject({ status: "imported", inserted: WEB_ROWS });

    expect(count("WEB2")).toBe(CLI_ROWS);
    expect(count("CLI2")).toBe(WEB_ROWS);
    expect(countRows(dbFile, "SELECT count(*) FROM attempts")).toBe(totalBefore + CLI_ROWS + WEB_ROWS);
    expectHealthy();
  });

  it("both wait when another writer keeps the lock longer than the busy timeout, then finish", { timeout: 300_000 }, async () => {
    const webFile = writeAttemptsFile(path.join(dir, "web-3.csv"), "WEB3", 2_000);
    const cliFile = writeAttemptsFile(path.join(dir, "cli-3.csv"), "CLI3", 2_000);
    // another writer (say a long import or a rescore) holds the write lock for 20 s
    const holder = new Database(dbFile);
    holder.exec("BEGIN IMMEDIATE");
    let released = false;
    try {
      const jobId = await startWebImport(webFile);
      const cli = startCli(dbFile, ["import", "attempts", cliFile, "--json"]);
      await sleep(20_000);
      const stillWaiting = await coordinator.get(`/api/imports/jobs/${jobId}`).expect(200);
      expect(stillWaiting.body.job.status).not.toBe("failed");
      expect(cli.child.exitCode).toBeNull();
      holder.exec("COMMIT");
      released = true;

      const [cliResult, job] = await Promise.all([cli.done, jobResult(jobId)]);
      expect(job.error).toBeNull();
      expect(job.summary).toMatchObject({ status: "imported", inserted: 2_000 });
      expect(cliResult.code, cliResult.stderr).toBe(0);
      expect(count("WEB3")).toBe(2_000);
      expect(count("CLI3")).toBe(2_000);
      expectHealthy();
    } finally {
      if (!released) holder.exec("ROLLBACK");
      holder.close();
    }
  });
});

describe("reads while another writer holds the lock", () => {
  it("answers a fresh session's reads (its first touch is skipped, not waited for)", { timeout: 120_000 }, async () => {
    const fresh = await signIn(app, "quality@test.example"); // a session this store has never touched
    const holder = new Database(dbFile);
    holder.exec("BEGIN IMMEDIATE");
    try {
      for (const url of ["/api/me", "/api/sites", "/api/insight/options"]) {
        const res = await fresh.get(url).timeout(60_000);
        expect(res.status, url).toBe(200);
      }
    } finally {
      holder.exec("ROLLBACK");
      holder.close();
    }
    // once the lock is free the session still works
    await fresh.get("/api/me").expect(200);
  });
});

describe("sign-in and sign-out while another writer holds the lock", () => {
  it("wait for the lock without stalling the server, then succeed", { timeout: 120_000 }, async () => {
    const leaving = await signIn(app, "funder@test.example");
    const holder = new Database(dbFile);
    holder.exec("BEGIN IMMEDIATE");
    let released = false;
    try {
      const signingIn = signIn(app, "a1@test.example");
      const signingOut = leaving.post("/api/auth/logout");
      // meanwhile the server answers other requests at once (its event loop is free)
      let answered = 0;
      const until = Date.now() + 17_000; // beyond the connection's 15 s busy timeout
      while (Date.now() < until) {
        expect((await coordinator.get("/api/sites")).status).toBe(200);
        answered++;
        await sleep(500);
      }
      expect(answered).toBeGreaterThan(10);
      holder.exec("COMMIT");
      released = true;
      const instructor = await signingIn;
      expect((await instructor.get("/api/me").expect(200)).body.user.email).toBe("a1@test.example");
      expect((await signingOut).status).toBe(204);
      await leaving.get("/api/me").expect(401);
    } finally {
      if (!released) holder.exec("ROLLBACK");
      holder.close();
    }
  });
});
