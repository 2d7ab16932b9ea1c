// Security headers (helmet) on API answers, on error answers and on the client's pages.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../server/db/client";
import { makeTestApp, makeTestDb, type TestApp } from "../helpers/testApp";

let db: Db;
let app: TestApp;
let withClient: TestApp;
let clientDir: string;

beforeAll(() => {
  db = makeTestDb();
  app = makeTestApp(db);
  clientDir = fs.mkdtempSync(path.join(os.tmpdir(), "qb-sec-client-"));
  fs.writeFileSync(path.join(clientDir, "index.html"), "<!doctype html><title>Quarterbeat</title><div id=root></div>");
  withClient = makeTestApp(db, { clientDir });
});
afterAll(() => {
  db.$client.close();
  fs.rmSync(clientDir, { recursive: true, force: true });
});

/** The CSP as directive → sources. */
function csp(header: string | undefined): Map<string, string[]> {
  expect(header).toBeDefined();
  return new Map(
    header!
      .split(";")
      .map((part) => part.trim().split(/\s+/))
      .filter((words) => words[0])
      .map(([name, ...sources]) => [name, sources]),
  );
}

function expectSecurityHeaders(res: request.Response, label: string) {
  const h = res.headers;
  expect(h["x-content-type-options"], label).toBe("nosniff");
  expect(h["x-frame-options"], label).toBe("SAMEORIGIN");
  expect(h["referrer-policy"], label).toBe("no-referrer");
  expect(h["strict-transport-security"], label).toMatch(/max-age=\d+/);
  expect(h["cross-origin-opener-policy"], label).toBe("same-origin");
  expect(h["cross-origin-resource-policy"], label).toBe("same-origin");
  expect(h["x-powered-by"], label).toBeUndefined();
  const policy = csp(h["content-security-policy"]);
  expect(policy.get("default-src"), label).toEqual(["'self'"]);
  expect(policy.get("script-src"), label).toEqual(["'self'"]); // no inline or eval'd scripts
  expect(policy.get("object-src"), label).toEqual(["'none'"]);
  expect(policy.get("frame-ancestors"), label).toEqual(["'self'"]);
  expect(policy.get("base-uri"), label).toEqual(["'self'"]);
  expect(policy.get("form-action"), label).toEqual(["'self'"]);
}

describe("security headers", () => {
  it.each([
    ["/api/health", 200],
    ["/api/me", 401],
    ["/api/no-such-route", 404],
    ["/api/insight/overview?quarter=nonsense", 401],
  ])("are on %s (%i)", async (url, status) => {
    const res = await request(app).get(url);
    expect(res.status).toBe(status);
    expectSecurityHeaders(res, url);
  });

  it("are on a refused state-changing request", async () => {
    const res = await request(app).post("/api/sites").send({});
    expect(res.status).toBe(403);
    expectSecurityHeaders(res, "POST /api/sites");
  });

  it("are on the client's pages, and the page shell is HTML only there", async () => {
    for (const url of ["/", "/insight/overview", "/sign-in"]) {
      const res = await request(withClient).get(url).expect(200);
      expect(res.headers["content-type"]).toMatch(/^text\/html/);
      expectSecurityHeaders(res, url);
    }
    // an unknown API path is never answered with the page shell
    const api = await request(withClient).get("/api/whatever").expect(404);
    expect(api.headers["content-type"]).toMatch(/^application\/json/);
  });
});
