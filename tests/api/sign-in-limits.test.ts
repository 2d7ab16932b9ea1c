// Sign-in limiting per address and account, per account and per address: one person's failures do not lock
// out a colleague at the same address, an attacker cycling addresses is still stopped at the account, and
// requests the limiter already refused add nothing to the other counters.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { SignInLimit } from "../../server/auth/signInLimits";
import type { Db } from "../../server/db/client";
import { anonymousAgent, makeTestApp, makeTestDb, seedPeople, signIn, TEST_PASSWORD, type TestApp } from "../helpers/testApp";

let db: Db;

beforeAll(async () => {
  db = makeTestDb();
  await seedPeople(db);
});
afterAll(() => db.$client.close());

/** An app that trusts one proxy, so each request can say which address it comes from. */
const limitedApp = (signInLimit: SignInLimit) => makeTestApp(db, { signInLimit, trustProxy: 1 });

async function attempt(app: TestApp, from: string, email: string, password: string): Promise<number> {
  const anon = await anonymousAgent(app);
  const res = await anon.agent.post("/api/auth/login").set("X-Forwarded-For", from).set("x-csrf-token", anon.csrfToken).send({ email, password });
  return res.status;
}

async function failures(app: TestApp, from: string, email: string, times: number): Promise<number[]> {
  const statuses: number[] = [];
  for (let i = 0; i < times; i++) statuses.push(await attempt(app, from, email, "wrong-password!"));
  return statuses;
}

describe("sign-in limits", () => {
  it("locks one account at one address after `limit` failures, not a colleague's account at that address", async () => {
    const app = limitedApp({ windowMs: 60_000, limit: 10 });
    expect(await failures(app, "10.0.0.1", "a1@test.example", 10)).toEqual(Array(10).fill(401));
    expect(await attempt(app, "10.0.0.1", "a1@test.example", TEST_PASSWORD)).toBe(429);
    // the colleague at the same address signs in with the right password
    expect(await attempt(app, "10.0.0.1", "b1@test.example", TEST_PASSWORD)).toBe(200);
    // and the owner, from another address, too
    expect(await attempt(app, "10.0.0.2", "a1@test.example", TEST_PASSWORD)).toBe(200);
  });

  it("stops an attacker who uses a new address for every guess at the account's limit", async () => {
    const app = limitedApp({ windowMs: 60_000, limit: 10, accountLimit: 5 });
    const statuses: number[] = [];
    for (let i = 1; i <= 7; i++) statuses.push(await attempt(app, `192.0.2.${i}`, "quality@test.example", "guess-number-" + i));
    expect(statuses).toEqual([401, 401, 401, 401, 401, 429, 429]);
    // now even the right password waits out the window: the guesses would otherwise go on
    expect(await attempt(app, "192.0.2.99", "quality@test.example", TEST_PASSWORD)).toBe(429);
    // other accounts are unaffected
    expect(await attempt(app, "192.0.2.99", "funder@test.example", TEST_PASSWORD)).toBe(200);
  });

  it("limits the account whatever case and spacing the e-mail is typed in", async () => {
    const app = limitedApp({ windowMs: 60_000, limit: 2 });
    expect(await attempt(app, "10.1.0.1", "a1@test.example", "wrong-password!")).toBe(401);
    expect(await attempt(app, "10.1.0.1", " A1@Test.Example ", "wrong-password!")).toBe(401);
    expect(await attempt(app, "10.1.0.1", "A1@TEST.EXAMPLE", "wrong-password!")).toBe(429);
  });

  it("stops one address trying one password on many accounts", async () => {
    const app = limitedApp({ windowMs: 60_000, limit: 10, addressLimit: 3 });
    const accounts = ["a1@test.example", "b1@test.example", "funder@test.example", "quality@test.example"];
    const statuses = [];
    for (const email of accounts) statuses.push(await attempt(app, "198.51.100.7", email, "Spring2026!!"));
    expect(statuses).toEqual([401, 401, 401, 429]);
    expect(await attempt(app, "198.51.100.8", "quality@test.example", TEST_PASSWORD)).toBe(200);
  });

  it("does not count requests it refused: knocking on after a lock-out adds nothing to the account's count", async () => {
    const app = limitedApp({ windowMs: 60_000, limit: 2, accountLimit: 4 });
    expect(await failures(app, "203.0.113.1", "b1@test.example", 8)).toEqual([401, 401, 429, 429, 429, 429, 429, 429]);
    // two guesses counted so far; two more are allowed from elsewhere before the account locks
    expect(await attempt(app, "203.0.113.2", "b1@test.example", "wrong-password!")).toBe(401);
    expect(await attempt(app, "203.0.113.3", "b1@test.example", "wrong-password!")).toBe(401);
    expect(await attempt(app, "203.0.113.4", "b1@test.example", "wrong-password!")).toBe(429);
  });

  it("counts neither successful sign-ins nor malformed forms", async () => {
    const app = limitedApp({ windowMs: 60_000, limit: 2 });
    for (let i = 0; i < 4; i++) expect(await attempt(app, "10.2.0.1", "coord@test.example", TEST_PASSWORD)).toBe(200);
    for (let i = 0; i < 4; i++) expect(await attempt(app, "10.2.0.1", "coord@test.example", "")).toBe(422);
    expect(await failures(app, "10.2.0.1", "coord@test.example", 3)).toEqual([401, 401, 429]);
  });

  it("limits guesses of the current password on the account page per account", async () => {
    const app = limitedApp({ windowMs: 60_000, limit: 2 });
    const signedIn = await signIn(app, "funder@test.example");
    const guess = (password: string) =>
      signedIn.post("/api/me/password", { currentPassword: password, newPassword: "never-applied-pw", confirmPassword: "never-applied-pw" });
    expect((await guess("guess-one")).status).toBe(422);
    expect((await guess("guess-two")).status).toBe(422);
    const limited = await guess(TEST_PASSWORD);
    expect(limited.status).toBe(429);
    expect(limited.body.error.message).toMatch(/Too many sign-in attempts/);
  });
});
