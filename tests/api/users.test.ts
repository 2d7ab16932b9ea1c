import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../server/db/client";
import { makeTestApp, makeTestDb, seedPeople, signIn, TEST_PASSWORD, type TestApp } from "../helpers/testApp";

let db: Db;
let app: TestApp;
let people: Awaited<ReturnType<typeof seedPeople>>;

beforeAll(async () => {
  db = makeTestDb();
  people = await seedPeople(db);
  app = makeTestApp(db);
});
afterAll(() => db.$client.close());

describe("user administration", () => {
  it("adds a user, who can then sign in; the welcome message failure is reported, not fatal", async () => {
    const coordinator = await signIn(app, "coord@test.example");
    const res = await coordinator
      .post("/api/users", { email: "New.Person@Test.Example", displayName: "New Person", role: "funder", password: "first-password-1" })
      .expect(201);
    expect(res.body.user).toMatchObject({ email: "new.person@test.example", role: "funder", active: true });
    // no SMTP_URL in tests: the account exists, the message is reported as not sent
    expect(res.body.welcome.sent).toBe(false);
    await signIn(app, "new.person@test.example", "first-password-1");
  });

  it("answers 422 with field messages from the shared schema", async () => {
    const coordinator = await signIn(app, "coord@test.example");
    const res = await coordinator.post("/api/users", { email: "not-an-email", displayName: "", role: "instructor", password: "short" }).expect(422);
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(["email", "displayName", "password"]));
  });

  it("requires an instructor link for the instructor role and refuses a duplicate e-mail", async () => {
    const coordinator = await signIn(app, "coord@test.example");
    const unlinked = await coordinator.post("/api/users", { email: "x@test.example", displayName: "X", role: "instructor", password: "long-enough-pw" });
    expect(unlinked.status).toBe(422);
    expect(unlinked.body.error.details[0].path).toBe("instructorId");
    const duplicate = await coordinator.post("/api/users", { email: "funder@test.example", displayName: "Dup", role: "funder", password: "long-enough-pw" });
    expect(duplicate.status).toBe(409);
  });

  it("deactivates a user, who can no longer sign in, and resets a password", async () => {
    const coordinator = await signIn(app, "coord@test.example");
    const quality = people.users.quality_lead;
    await coordinator.post(`/api/users/${quality.id}/password`, { password: "reset-password-1" }).expect(204);
    await signIn(app, "quality@test.example", "reset-password-1");
    await coordinator.patch(`/api/users/${quality.id}`, { active: false }).expect(200);
    await expect(signIn(app, "quality@test.example", "reset-password-1")).rejects.toThrow(/401/);
  });

  it("does not let a coordinator lock themselves out", async () => {
    const coordinator = await signIn(app, "coord@test.example");
    const me = people.users.coordinator;
    await coordinator.patch(`/api/users/${me.id}`, { active: false }).expect(409);
    await coordinator.patch(`/api/users/${me.id}`, { role: "funder" }).expect(409);
  });

  it("ends a deactivated user's open session", async () => {
    const funder = await signIn(app, "funder@test.example", TEST_PASSWORD);
    const coordinator = await signIn(app, "coord@test.example");
    await funder.get("/api/me").expect(200);
    await coordinator.patch(`/api/users/${people.users.funder.id}`, { active: false }).expect(200);
    await funder.get("/api/me").expect(401);
  });
});

describe("sites", () => {
  it("counts each site's own instructors", async () => {
    const coordinator = await signIn(app, "coord@test.example");
    const created = await coordinator.post("/api/instructors", { code: "A2", name: "Instructor A2", siteId: people.sites.north.id }).expect(201);
    expect(created.body.instructor.siteCode).toBe("NORTH");
    const { body } = await coordinator.get("/api/sites").expect(200);
    const bySite = Object.fromEntries(body.sites.map((s: { code: string; instructors: number }) => [s.code, s.instructors]));
    // NORTH: A1 and A2; SOUTH: B1
    expect(bySite).toEqual({ NORTH: 2, SOUTH: 1 });
  });
});
