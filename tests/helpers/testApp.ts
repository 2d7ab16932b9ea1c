// A fresh SQLite file per test file, the real app on it, and signed-in supertest agents for each role.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import request from "supertest";
import type { UserRole } from "../../shared/domain";
import { createApp, type AppOptions } from "../../server/app";
import { loadConfig } from "../../server/config";
import { openDatabase, type Db } from "../../server/db/client";
import { createInstructor, createSite } from "../../server/sites/service";
import { createUser } from "../../server/users/service";

export const TEST_PASSWORD = "correct-horse-battery";

export function tempDbFile(prefix = "qb-test"): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), `${prefix}-`));
  return path.join(dir, "quarterbeat.sqlite");
}

export function makeTestDb(file = tempDbFile()): Db {
  return openDatabase(file);
}

export function makeTestApp(db: Db, options: AppOptions = {}) {
  const config = loadConfig({ NODE_ENV: "test", SESSION_SECRET: "test-secret-at-least-16-chars" });
  return createApp(db, config, { clientDir: null, ...options });
}

export type TestApp = ReturnType<typeof makeTestApp>;

/** One account per role; the instructor accounts are linked to instructors A1 and B1 at sites NORTH and SOUTH. */
export async function seedPeople(db: Db) {
  const north = createSite(db, { code: "NORTH", name: "Northfield Hall" });
  const south = createSite(db, { code: "SOUTH", name: "Southmoor Centre" });
  const a1 = createInstructor(db, { code: "A1", name: "Instructor A1", siteId: north.id });
  const b1 = createInstructor(db, { code: "B1", name: "Instructor B1", siteId: south.id });
  const make = (email: string, role: UserRole, instructorId: number | null = null) =>
    createUser(db, { email, displayName: email.split("@")[0], role, instructorId, password: TEST_PASSWORD });
  const users = {
    coordinator: await make("coord@test.example", "coordinator"),
    quality_lead: await make("quality@test.example", "quality_lead"),
    instructor: await make("a1@test.example", "instructor", a1.id),
    otherInstructor: await make("b1@test.example", "instructor", b1.id),
    funder: await make("funder@test.example", "funder"),
  };
  return { sites: { north, south }, instructors: { a1, b1 }, users };
}

/** A supertest agent that keeps cookies and sends the CSRF header on every state-changing request. */
export interface Agent {
  agent: ReturnType<typeof request.agent>;
  csrfToken: string;
  get(url: string): request.Test;
  post(url: string, body?: object): request.Test;
  patch(url: string, body?: object): request.Test;
  put(url: string, body?: object): request.Test;
  delete(url: string): request.Test;
}

function wrap(agent: ReturnType<typeof request.agent>, csrfToken: string): Agent {
  const self: Agent = {
    agent,
    csrfToken,
    get: (url) => agent.get(url),
    post: (url, body) =>
      agent
        .post(url)
        .set("x-csrf-token", self.csrfToken)
        .send(body ?? {}),
    patch: (url, body) =>
      agent
        .patch(url)
        .set("x-csrf-token", self.csrfToken)
        .send(body ?? {}),
    put: (url, body) =>
      agent
        .put(url)
        .set("x-csrf-token", self.csrfToken)
        .send(body ?? {}),
    delete: (url) => agent.delete(url).set("x-csrf-token", self.csrfToken),
  };
  return self;
}

export async function anonymousAgent(app: TestApp): Promise<Agent> {
  const agent = request.agent(app);
  const res = await agent.get("/api/auth/csrf").expect(200);
  return wrap(agent, res.body.csrfToken);
}

export async function signIn(app: TestApp, email: string, password = TEST_PASSWORD): Promise<Agent> {
  const anon = await anonymousAgent(app);
  const res = await anon.post("/api/auth/login", { email, password });
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  anon.csrfToken = res.body.csrfToken;
  return anon;
}
