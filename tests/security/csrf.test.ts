// Double-submit CSRF: every state-changing route (read from the routers) refuses a request without the
// token, and one carrying another session's token, with 403 "csrf" before it does anything.
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../server/db/client";
import { makeTestApp, makeTestDb, seedPeople, signIn, type Agent, type TestApp } from "../helpers/testApp";
import { rowCounts } from "./dbState";
import { fillParams, listRoutes, STATE_CHANGING, type RouteEntry } from "./routes";

let db: Db;
let app: TestApp;
let coordinator: Agent;
let other: Agent;
let routes: RouteEntry[];

const COOKIE_SCOPE = { domain: "127.0.0.1", path: "/", secure: false, script: false };
const cookieOf = (agent: Agent, name: string) => agent.agent.jar.getCookie(name, COOKIE_SCOPE)?.value;

beforeAll(async () => {
  db = makeTestDb();
  await seedPeople(db);
  app = makeTestApp(db);
  coordinator = await signIn(app, "coord@test.example");
  other = await signIn(app, "quality@test.example");
  routes = listRoutes(app).filter((r) => STATE_CHANGING.includes(r.method));
});
afterAll(() => db.$client.close());

function send(test: request.Test, body: object = {}) {
  return test.send(body);
}

describe("the list of state-changing routes", () => {
  it("is read from the routers and holds the routes every feature adds", () => {
    const names = routes.map((r) => `${r.method.toUpperCase()} ${r.path}`);
    for (const expected of [
      "POST /api/auth/login",
      "POST /api/auth/logout",
      "PATCH /api/me",
      "POST /api/me/password",
      "POST /api/users",
      "PATCH /api/users/:id",
      "POST /api/sites",
      "PUT /api/settings/policy",
      "POST /api/imports/uploads",
      "POST /api/imports/batches/:id/undo",
      "DELETE /api/imports/presets/:id",
      "POST /api/reports/:period",
      "PUT /api/reports/:period/notes",
      "POST /api/reports/:id/release",
      "POST /api/report-sends/:id/retry",
    ]) {
      expect(names).toContain(expected);
    }
  });
});

describe("a request without the token", () => {
  it("is refused on every state-changing route with 403 csrf, and changes nothing", async () => {
    const before = rowCounts(db);
    for (const route of routes) {
      const url = fillParams(route.path);
      const res = await send(coordinator.agent[route.method](url));
      expect(res.status, `${route.method} ${url}`).toBe(403);
      expect(res.body.error?.code, `${route.method} ${url}`).toBe("csrf");
    }
    expect(rowCounts(db)).toEqual(before);
    // still signed in: the refusals did not end the session (GET /api/me hands out a fresh token)
    const me = await coordinator.get("/api/me").expect(200);
    coordinator.csrfToken = me.body.csrfToken;
  });

  it("is refused when the token is empty or made up", async () => {
    for (const token of ["", "x", "a".repeat(200)]) {
      const res = await coordinator.agent.post("/api/sites").set("x-csrf-token", token).send({ code: "NOPE", name: "No token" });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe("csrf");
    }
  });
});

describe("a request with another session's token", () => {
  it("is refused on every state-changing route when the header carries the other session's token", async () => {
    const before = rowCounts(db);
    expect(other.csrfToken).not.toBe(coordinator.csrfToken);
    for (const route of routes) {
      const url = fillParams(route.path);
      const res = await send(coordinator.agent[route.method](url).set("x-csrf-token", other.csrfToken));
      expect(res.status, `${route.method} ${url}`).toBe(403);
      expect(res.body.error?.code, `${route.method} ${url}`).toBe("csrf");
    }
    expect(rowCounts(db)).toEqual(before);
  });

  it("is refused when both the token cookie and the header come from the other session", async () => {
    const sid = cookieOf(coordinator, "qb.sid");
    const otherCsrfCookie = cookieOf(other, "qb.csrf");
    expect(sid).toBeDefined();
    expect(otherCsrfCookie).toBeDefined();
    const before = rowCounts(db);
    for (const route of routes) {
      const url = fillParams(route.path);
      const res = await send(request(app)[route.method](url).set("Cookie", `qb.sid=${sid}; qb.csrf=${otherCsrfCookie}`).set("x-csrf-token", other.csrfToken));
      expect(res.status, `${route.method} ${url}`).toBe(403);
      expect(res.body.error?.code, `${route.method} ${url}`).toBe("csrf");
    }
    expect(rowCounts(db)).toEqual(before);
  });

  it("keeps working for the session's own token (the refusals above are the token's doing)", async () => {
    const res = await coordinator.post("/api/sites", { code: "OWNTOKEN", name: "Own token site" });
    expect(res.status).toBe(201);
  });
});

describe("every state-changing route with the session's own token", () => {
  it("gets past the CSRF check", async () => {
    for (const route of routes) {
      // a fresh session per route, since some of them (sign-out) end it
      const fresh = await signIn(app, "coord@test.example");
      const url = fillParams(route.path);
      const res = await send(fresh.agent[route.method](url).set("x-csrf-token", fresh.csrfToken));
      expect(res.body?.error?.code, `${route.method} ${url}: ${JSON.stringify(res.body)}`).not.toBe("csrf");
      expect(res.status, `${route.method} ${url}`).toBeLessThan(500);
    }
  });
});
