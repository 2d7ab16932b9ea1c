// A password change or reset ends the user's other sessions and gives the changing session a new id; sign-out
// clears both cookies.
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { SessionData } from "express-session";
import { SqliteSessionStore } from "../../server/auth/sessionStore";
import type { Db } from "../../server/db/client";
import { makeTestApp, makeTestDb, seedPeople, signIn, TEST_PASSWORD, type Agent, type TestApp } from "../helpers/testApp";

let db: Db;
let app: TestApp;
let people: Awaited<ReturnType<typeof seedPeople>>;

beforeAll(async () => {
  db = makeTestDb();
  people = await seedPeople(db);
  app = makeTestApp(db);
});
afterAll(() => db.$client.close());

const COOKIE_SCOPE = { domain: "127.0.0.1", path: "/", secure: false, script: false };
const sessionId = (agent: Agent) => agent.agent.jar.getCookie("qb.sid", COOKIE_SCOPE)?.value;
const isSignedIn = async (sid: string | undefined) => (await request(app).get("/api/me").set("Cookie", `qb.sid=${sid}`)).status === 200;

function change(agent: Agent, from: string, to: string) {
  return agent.post("/api/me/password", { currentPassword: from, newPassword: to, confirmPassword: to });
}

describe("changing one's own password", () => {
  it("ends the user's other sessions, keeps the changing one with a new id and a working token", async () => {
    const laptop = await signIn(app, "a1@test.example");
    const phone = await signIn(app, "a1@test.example");
    const colleague = await signIn(app, "b1@test.example");
    const laptopSidBefore = sessionId(laptop);

    const res = await change(laptop, TEST_PASSWORD, "a-brand-new-password").expect(200);
    expect(res.body.user.email).toBe("a1@test.example");

    // the session that changed the password moved to a new id; the old id is dead
    expect(sessionId(laptop)).not.toBe(laptopSidBefore);
    expect(await isSignedIn(laptopSidBefore)).toBe(false);
    // the token in the answer belongs to the new session: a state-changing request goes through with it
    laptop.csrfToken = res.body.csrfToken;
    await laptop.patch("/api/me", { lengthUnit: "in" }).expect(200);

    await phone.get("/api/me").expect(401);
    await colleague.get("/api/me").expect(200);
  });

  it("ends no session when the current password is wrong", async () => {
    const first = await signIn(app, "b1@test.example");
    const second = await signIn(app, "b1@test.example");
    await change(first, "not-my-password", "another-new-password").expect(422);
    await second.get("/api/me").expect(200);
    await first.get("/api/me").expect(200);
  });
});

describe("a coordinator's reset", () => {
  it("ends every session of the user whose password was reset, and none of the coordinator's", async () => {
    const coordinator = await signIn(app, "coord@test.example");
    const quality = await signIn(app, "quality@test.example");
    const qualityElsewhere = await signIn(app, "quality@test.example");
    const coordinatorSid = sessionId(coordinator);

    await coordinator.post(`/api/users/${people.users.quality_lead.id}/password`, { password: "reset-by-coordinator" }).expect(204);

    await quality.get("/api/me").expect(401);
    await qualityElsewhere.get("/api/me").expect(401);
    expect(sessionId(coordinator)).toBe(coordinatorSid);
    await coordinator.get("/api/me").expect(200);
    await signIn(app, "quality@test.example", "reset-by-coordinator");
  });

  it("resetting one's own password ends one's other sessions and rotates the current one", async () => {
    const desk = await signIn(app, "coord@test.example");
    const other = await signIn(app, "coord@test.example");
    const before = sessionId(desk);
    const res = await desk.post(`/api/users/${people.users.coordinator.id}/password`, { password: "coordinator-new-pw" }).expect(200);
    expect(sessionId(desk)).not.toBe(before);
    desk.csrfToken = res.body.csrfToken;
    await desk.get("/api/users").expect(200);
    await desk.patch("/api/me", { lengthUnit: "mm" }).expect(200);
    await other.get("/api/me").expect(401);
  });
});

describe("a request that was under way when its session ended", () => {
  it("cannot write the ended session back when it finishes", async () => {
    const store = new SqliteSessionStore(db);
    const agent = await signIn(app, "funder@test.example");
    const sid = decodeURIComponent(sessionId(agent)!).slice(2).split(".")[0]; // "s:<id>.<signature>"
    // what that request loaded before the session ended
    const loaded = await new Promise<SessionData | null | undefined>((resolve, reject) => store.get(sid, (err, sess) => (err ? reject(err) : resolve(sess))));
    expect((loaded as { passport?: { user?: number } } | null)?.passport?.user).toBe(people.users.funder.id);

    await store.endSessionsOfUser(people.users.funder.id);
    await new Promise<void>((resolve, reject) => store.set(sid, loaded!, (err) => (err ? reject(err) : resolve())));

    await agent.get("/api/me").expect(401);
  });
});

describe("sign-out", () => {
  it("clears the session cookie and the CSRF cookie", async () => {
    const agent = await signIn(app, "b1@test.example");
    expect(agent.agent.jar.getCookie("qb.csrf", COOKIE_SCOPE)).toBeDefined();
    const res = await agent.post("/api/auth/logout").expect(204);
    const cleared = (res.headers["set-cookie"] as unknown as string[]).filter((line) => /Expires=Thu, 01 Jan 1970/.test(line));
    expect(cleared.map((line) => line.split("=")[0]).sort()).toEqual(["qb.csrf", "qb.sid"]);
    expect(agent.agent.jar.getCookie("qb.csrf", COOKIE_SCOPE)).toBeUndefined();
    expect(agent.agent.jar.getCookie("qb.sid", COOKIE_SCOPE)).toBeUndefined();
  });
});
