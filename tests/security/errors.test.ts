// Bad requests get a short JSON error with a code and a message for people: never a stack trace, SQL,
// database error text or a server path, whatever was sent (broken JSON, wrong types, odd multipart forms).
import { Writable } from "node:stream";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../server/db/client";
import { createLogger } from "../../server/logging/logger";
import { makeTestApp, makeTestDb, seedPeople, signIn, type Agent, type TestApp } from "../helpers/testApp";

let db: Db;
let app: TestApp;
let coordinator: Agent;

beforeAll(async () => {
  db = makeTestDb();
  await seedPeople(db);
  app = makeTestApp(db);
  coordinator = await signIn(app, "coord@test.example");
});
afterAll(() => db.$client.close());

function expectCleanError(res: request.Response, label: string) {
  expect(res.headers["content-type"], label).toMatch(/^application\/json/);
  expect(res.body.error, label).toBeDefined();
  expect(typeof res.body.error.code, label).toBe("string");
  expect(res.body.error.message, label).toMatch(/\w/);
  const text = res.text;
  expect(text, label).not.toMatch(/\bat .+:\d+:\d+/); // stack lines
  expect(text, label).not.toMatch(/SQLITE|SqliteError/i);
  expect(text, label).not.toMatch(/\bSELECT\b|\bINSERT\b|\bUPDATE\b.+\bSET\b/);
  expect(text, label).not.toMatch(/node_modules|\/work\/|\.ts\b/);
  expect(text, label).not.toMatch(/<html|<pre/i);
}

const json = (method: "post" | "patch" | "put", url: string, body: string, type = "application/json") =>
  coordinator.agent[method](url).set("x-csrf-token", coordinator.csrfToken).set("content-type", type).send(body);

describe("broken and wrongly typed bodies", () => {
  const cases: { label: string; send: () => request.Test; status: number }[] = [
    { label: "malformed JSON", send: () => json("post", "/api/sites", '{"code": "X1", "name": '), status: 400 },
    { label: "JSON that is a bare string", send: () => json("post", "/api/sites", '"just text"'), status: 400 },
    { label: "JSON with a trailing comma", send: () => json("put", "/api/settings/policy", '{"note": "x",}'), status: 400 },
    { label: "an unsupported charset", send: () => json("post", "/api/sites", '{"code":"X1"}', "application/json; charset=latin1"), status: 415 },
    { label: "a number where a name goes", send: () => coordinator.post("/api/sites", { code: 12, name: 34 }), status: 422 },
    { label: "an array where an object goes", send: () => coordinator.patch("/api/users/1", [1, 2, 3] as unknown as object), status: 422 },
    { label: "an unknown role", send: () => coordinator.patch("/api/users/2", { role: "superuser" }), status: 422 },
    { label: "a policy of the wrong shape", send: () => coordinator.put("/api/settings/policy", { policy: { adult: "deep" }, note: 5 }), status: 422 },
    { label: "a huge number as an id in the body", send: () => coordinator.patch("/api/instructors/1", { siteId: 1e308 }), status: 422 },
    { label: "prototype keys", send: () => json("post", "/api/sites", '{"__proto__": {"admin": true}, "constructor": {"prototype": {"x": 1}}}'), status: 422 },
    { label: "form-encoded body on a JSON route", send: () => json("post", "/api/sites", "code=X1&name=Y", "application/x-www-form-urlencoded"), status: 422 },
    { label: "deeply nested JSON", send: () => json("post", "/api/sites", "[".repeat(50_000) + "]".repeat(50_000)), status: 422 },
  ];
  it.each(cases)("$label → $status", async ({ label, send, status }) => {
    const res = await send();
    expect(res.status, `${label}: ${res.text}`).toBe(status);
    expectCleanError(res, label);
  });

  it("names the fields that are wrong", async () => {
    const res = await coordinator.post("/api/sites", { code: 12, name: 34 }).expect(422);
    expect(res.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(["code", "name"]);
  });
});

describe("odd URLs", () => {
  it.each([
    ["/api/nope", 404],
    ["/api/classes/%E0%A4%A", 400],
    ["/api/imports/batches/99999999999999999999999999999", 404],
    [`/api/attempts/${"A".repeat(500)}`, 422],
    ["/api/attempts?page=1e400", 422],
    ["/api/attempts?pageSize=-1", 422],
    ["/api/insight/overview?quarter=2026-Q2&quarter=2026-Q3", 422],
    ["/api/insight/overview?from=2026-Q3&to=2026-Q1", 422],
    ["/api/insight/overview?from=1000-Q1&to=9999-Q4", 422],
  ])("%s → %i", async (url, status) => {
    const res = await coordinator.get(url);
    expect(res.status, res.text).toBe(status);
    expectCleanError(res, url);
  });

  it("answers a method a route does not have with a JSON 404", async () => {
    const res = await coordinator.delete("/api/sites");
    expect(res.status).toBe(404);
    expectCleanError(res, "DELETE /api/sites");
  });
});

describe("odd multipart forms", () => {
  const csv = Buffer.from("class_id,date,site,instructor,course,learners,passed,manikins\n");
  const post = () => coordinator.agent.post("/api/imports/uploads").set("x-csrf-token", coordinator.csrfToken);

  it.each([
    {
      label: "two files",
      send: () =>
        post()
          .field("kind", "classes")
          .attach("file", csv, { filename: "a.csv", contentType: "text/csv" })
          .attach("file", csv, { filename: "b.csv", contentType: "text/csv" }),
    },
    {
      label: "a file under another field name",
      send: () => post().field("kind", "classes").attach("upload", csv, { filename: "a.csv", contentType: "text/csv" }),
    },
    {
      label: "too many fields",
      send: () => {
        let test = post();
        for (let i = 0; i < 10; i++) test = test.field(`f${i}`, "x");
        return test.attach("file", csv, { filename: "a.csv", contentType: "text/csv" });
      },
    },
    {
      label: "a form cut off in the middle",
      send: () =>
        post()
          .set("content-type", "multipart/form-data; boundary=XYZ")
          .send(
            '--XYZ\r\nContent-Disposition: form-data; name="kind"\r\n\r\nclasses\r\n--XYZ\r\nContent-Disposition: form-data; name="file"; filename="a.csv"\r\nContent-Type: text/csv\r\n\r\nclass_id,da',
          ),
    },
    { label: "a multipart type without a boundary", send: () => post().set("content-type", "multipart/form-data").send("garbage") },
    { label: "no form at all", send: () => post().send({ kind: "classes" }) },
  ])("$label → 4xx", async ({ label, send }) => {
    const res = await send();
    expect(res.status, `${label}: ${res.text}`).toBeGreaterThanOrEqual(400);
    expect(res.status, `${label}: ${res.text}`).toBeLessThan(500);
    expectCleanError(res, label);
  });
});

describe("a failure inside the server", () => {
  it("answers 500 with a generic message, no SQL and no stack, and logs the error on the server", async () => {
    const broken = makeTestDb();
    await seedPeople(broken);
    const logged: string[] = [];
    const stream = new Writable({ write: (chunk, _encoding, done) => (logged.push(chunk.toString()), done()) });
    const brokenApp = makeTestApp(broken, { logger: createLogger({ logLevel: "error", nodeEnv: "test" }, stream) });
    const agent = await signIn(brokenApp, "coord@test.example");
    broken.$client.exec("PRAGMA foreign_keys = OFF; DROP TABLE instructors;");
    try {
      const res = await agent.get("/api/instructors");
      expect(res.status).toBe(500);
      expect(res.body.error).toEqual({ code: "internal", message: expect.stringMatching(/went wrong/) });
      expectCleanError(res, "500");
      // the server's log has what the answer leaves out: SQLite's own message, at level error (the failure comes
      // while the session is read, before any route matched)
      expect(logged).toHaveLength(1);
      expect(JSON.parse(logged[0])).toMatchObject({
        level: 50,
        method: "GET",
        route: null,
        status: 500,
        err: { message: expect.stringMatching(/no such table: instructors/) },
      });
    } finally {
      broken.$client.close();
    }
  });
});
