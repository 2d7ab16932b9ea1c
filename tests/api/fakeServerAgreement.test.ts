// Component tests answer from a fake server (tests/components/testServer.ts). Its canned error answers must be
// the ones the real server gives, or the components are tested against answers that never happen.
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import request from "supertest";
import type { Db } from "../../server/db/client";
import { fakeServer, signedOut } from "../components/testServer";
import { makeTestApp, makeTestDb, type TestApp } from "../helpers/testApp";

let db: Db;
let app: TestApp;

beforeAll(() => {
  db = makeTestDb();
  app = makeTestApp(db);
});
afterAll(() => db.$client.close());
afterEach(() => vi.unstubAllGlobals());

describe("the component tests' fake server agrees with the server", () => {
  it("answers a signed-out request as the server does, on the session route and on a guarded page", async () => {
    const fake = signedOut.body as { error: { code: string; message: string } };
    for (const path of ["/api/me", "/api/insight/overview"]) {
      const res = await request(app).get(path);
      expect(res.status, path).toBe(signedOut.status);
      expect(res.body.error.code, path).toBe(fake.error.code);
      expect(res.body.error.message, path).toBe(fake.error.message);
    }
  });

  it("answers a route it does not know with the server's not-found code", async () => {
    const server = await request(app).get("/api/no-such-route");
    fakeServer({});
    const fake = await fetch("/api/no-such-route");
    expect(fake.status).toBe(server.status);
    expect(((await fake.json()) as { error: { code: string } }).error.code).toBe(server.body.error.code);
  });
});
