import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { anonymousAgent, makeTestApp, makeTestDb, seedPeople, signIn, TEST_PASSWORD, type TestApp } from "../helpers/testApp";
import type { Db } from "../../server/db/client";

let db: Db;
let app: TestApp;

beforeAll(async () => {
  db = makeTestDb();
  await seedPeople(db);
  app = makeTestApp(db, { signInLimit: { windowMs: 60_000, limit: 5 } });
});
afterAll(() => db.$client.close());

describe("sign-in", () => {
  it("answers health without sign-in and 401 on /api/me when signed out", async () => {
    const anon = await anonymousAgent(app);
    const health = await anon.get("/api/health").expect(200);
    expect(health.body.ok).toBe(true);
    await anon.get("/api/me").expect(401);
  });

  it("signs in with the right password and returns the user with role", async () => {
    const coordinator = await signIn(app, "coord@test.example");
    const me = await coordinator.get("/api/me").expect(200);
    expect(me.body.user).toMatchObject({ email: "coord@test.example", role: "coordinator" });
  });

  it("refuses a wrong password and an unknown e-mail with the same generic message", async () => {
    const anon = await anonymousAgent(app);
    const wrong = await anon.post("/api/auth/login", { email: "coord@test.example", password: "not-the-password" }).expect(401);
    const unknown = await anon.post("/api/auth/login", { email: "nobody@test.example", password: "whatever-it-is" }).expect(401);
    expect(wrong.body.error.message).toBe(unknown.body.error.message);
  });

  it("refuses a state-changing request without the CSRF token", async () => {
    const coordinator = await signIn(app, "coord@test.example");
    const res = await coordinator.agent.post("/api/sites").send({ code: "X1", name: "No token" });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe("csrf");
  });

  it("changes the session id at sign-in (no session fixation)", async () => {
    const anon = await anonymousAgent(app);
    const before = anon.agent.jar.getCookie("qb.sid", { domain: "127.0.0.1", path: "/", secure: false, script: false });
    const res = await anon.post("/api/auth/login", { email: "quality@test.example", password: TEST_PASSWORD }).expect(200);
    const setCookie = String(res.headers["set-cookie"]);
    expect(setCookie).toContain("qb.sid=");
    expect(setCookie).toMatch(/HttpOnly/i);
    expect(setCookie).toMatch(/SameSite=Lax/i);
    expect(before?.value).toBeDefined();
    expect(setCookie).not.toContain(`qb.sid=${before?.value}`);
  });

  it("changes a password: the old one stops working, the new one works", async () => {
    const funder = await signIn(app, "funder@test.example");
    await funder
      .post("/api/me/password", { currentPassword: TEST_PASSWORD, newPassword: "a-new-long-password", confirmPassword: "a-new-long-password" })
      .expect(200);
    const anon = await anonymousAgent(app);
    await anon.post("/api/auth/login", { email: "funder@test.example", password: TEST_PASSWORD }).expect(401);
    await signIn(app, "funder@test.example", "a-new-long-password");
  });

  it("rate-limits repeated sign-in attempts with 429 and a clear message", async () => {
    const limited = makeTestApp(db, { signInLimit: { windowMs: 60_000, limit: 3 } });
    const anon = await anonymousAgent(limited);
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++) {
      const res = await anon.post("/api/auth/login", { email: "coord@test.example", password: "wrong-password!" });
      statuses.push(res.status);
      if (res.status === 429) expect(res.body.error.message).toMatch(/Too many sign-in attempts/);
    }
    expect(statuses.slice(0, 3)).toEqual([401, 401, 401]);
    expect(statuses.slice(3)).toEqual([429, 429]);
  });

  it("keeps the session across a server restart (sessions stored in SQLite)", async () => {
    const coordinator = await signIn(app, "coord@test.example");
    const restarted = makeTestApp(db);
    const cookie = coordinator.agent.jar.getCookie("qb.sid", { domain: "127.0.0.1", path: "/", secure: false, script: false });
    expect(cookie).toBeDefined();
    const { default: request } = await import("supertest");
    const res = await request(restarted).get("/api/me").set("Cookie", `qb.sid=${cookie!.value}`);
    expect(res.status).toBe(200);
    expect(res.body.user.email).toBe("coord@test.example");
  });
});
