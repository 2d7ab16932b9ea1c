// Session cookies: a new id at sign-in (the id known before sign-in never becomes a signed-in one), the id is
// dead after sign-out, and the flags that keep scripts and other sites away from the cookies, with Secure
// and the __Host- prefix in production.
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { loadConfig } from "../../server/config";
import type { Db } from "../../server/db/client";
import { anonymousAgent, makeTestApp, makeTestDb, seedPeople, signIn, TEST_PASSWORD, type TestApp } from "../helpers/testApp";

let db: Db;
let app: TestApp;

beforeAll(async () => {
  db = makeTestDb();
  await seedPeople(db);
  app = makeTestApp(db);
});
afterAll(() => db.$client.close());

const COOKIE_SCOPE = { domain: "127.0.0.1", path: "/", secure: false, script: false };

/** name → the whole Set-Cookie line for that cookie. */
function setCookies(res: request.Response): Map<string, string> {
  const raw = res.headers["set-cookie"] as unknown as string[] | undefined;
  return new Map((raw ?? []).map((line) => [line.slice(0, line.indexOf("=")), line]));
}
const valueOf = (line: string | undefined) => line?.slice(line.indexOf("=") + 1).split(";")[0];

describe("session fixation", () => {
  it("gives a new session id at sign-in, and the id from before sign-in is not signed in", async () => {
    const anon = await anonymousAgent(app);
    const before = anon.agent.jar.getCookie("qb.sid", COOKIE_SCOPE)?.value;
    expect(before).toBeTruthy();
    const res = await anon.post("/api/auth/login", { email: "coord@test.example", password: TEST_PASSWORD }).expect(200);
    const after = valueOf(setCookies(res).get("qb.sid"));
    expect(after).toBeTruthy();
    expect(after).not.toBe(before);

    // the new id is signed in, the old one is not
    expect((await request(app).get("/api/me").set("Cookie", `qb.sid=${after}`)).status).toBe(200);
    const old = await request(app).get("/api/me").set("Cookie", `qb.sid=${before}`);
    expect(old.status).toBe(401);
  });

  it("ends the session at sign-out: the id stops working", async () => {
    const coordinator = await signIn(app, "coord@test.example");
    const sid = coordinator.agent.jar.getCookie("qb.sid", COOKIE_SCOPE)!.value;
    expect((await request(app).get("/api/me").set("Cookie", `qb.sid=${sid}`)).status).toBe(200);
    await coordinator.post("/api/auth/logout").expect(204);
    expect((await request(app).get("/api/me").set("Cookie", `qb.sid=${sid}`)).status).toBe(401);
  });

  it("does not accept a session id the server never issued", async () => {
    const made = "s%3Amade-up-session-id.AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA";
    expect((await request(app).get("/api/me").set("Cookie", `qb.sid=${made}`)).status).toBe(401);
  });
});

describe("cookie flags", () => {
  it("marks the session and token cookies HttpOnly and SameSite=Lax, without Secure outside production", async () => {
    const res = await request(app).get("/api/auth/csrf").expect(200);
    const cookies = setCookies(res);
    for (const name of ["qb.sid", "qb.csrf"]) {
      const line = cookies.get(name);
      expect(line, name).toBeDefined();
      expect(line).toMatch(/;\s*HttpOnly/i);
      expect(line).toMatch(/;\s*SameSite=Lax/i);
      expect(line).not.toMatch(/;\s*Secure/i);
    }
  });

  describe("in production", () => {
    let prodApp: ReturnType<typeof createApp>;
    beforeAll(() => {
      const config = loadConfig({ NODE_ENV: "production", SESSION_SECRET: "production-secret-at-least-16" });
      prodApp = createApp(db, config, { clientDir: null });
    });

    it("adds Secure to both cookies and names the token cookie __Host- (host-only, path /)", async () => {
      // behind the TLS-terminating proxy that production trusts
      const res = await request(prodApp).get("/api/auth/csrf").set("X-Forwarded-Proto", "https").expect(200);
      const cookies = setCookies(res);
      const sid = cookies.get("qb.sid");
      const token = cookies.get("__Host-qb.csrf");
      expect(sid).toBeDefined();
      expect(token).toBeDefined();
      expect(cookies.has("qb.csrf")).toBe(false);
      for (const line of [sid!, token!]) {
        expect(line).toMatch(/;\s*Secure/i);
        expect(line).toMatch(/;\s*HttpOnly/i);
        expect(line).toMatch(/;\s*SameSite=Lax/i);
      }
      expect(token).toMatch(/;\s*Path=\//i);
      expect(token).not.toMatch(/;\s*Domain=/i);
    });

    it("signs in over https with a new Secure session cookie", async () => {
      const first = await request(prodApp).get("/api/auth/csrf").set("X-Forwarded-Proto", "https").expect(200);
      const cookies = setCookies(first);
      const cookieHeader = [...cookies.values()].map((line) => line.split(";")[0]).join("; ");
      const res = await request(prodApp)
        .post("/api/auth/login")
        .set("X-Forwarded-Proto", "https")
        .set("Cookie", cookieHeader)
        .set("x-csrf-token", first.body.csrfToken)
        .send({ email: "coord@test.example", password: TEST_PASSWORD });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      const sid = setCookies(res).get("qb.sid");
      expect(sid).toMatch(/;\s*Secure/i);
      expect(sid).toMatch(/;\s*HttpOnly/i);
      expect(valueOf(sid)).not.toBe(valueOf(cookies.get("qb.sid")));
    });

    it("never sends the session cookie over plain http", async () => {
      const res = await request(prodApp).get("/api/auth/csrf").expect(200);
      const line = setCookies(res).get("qb.sid");
      if (line) expect(line).toMatch(/;\s*Secure/i);
    });
  });
});
