// Component tests answer from a fake server (tests/components/testServer.ts, on msw). Its canned error answers
// must be the ones the real server gives, or the components are tested against answers that never happen.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import request from "supertest";
import type { Db } from "../../server/db/client";
import { componentServer, fakeApiOrigin, fakeServer, signedOut } from "../components/testServer";
import { makeTestApp, makeTestDb, type TestApp } from "../helpers/testApp";

let db: Db;
let app: TestApp;

beforeAll(() => {
  db = makeTestDb();
  app = makeTestApp(db);
  // supertest talks to the app over a real socket; only the fake's own origin is intercepted
  componentServer.listen({ onUnhandledRequest: "bypass" });
});
afterAll(() => {
  componentServer.close();
  db.$client.close();
});

describe("the component tests' fake server agrees with the server", () => {
  it("answers a signed-out request as the server does, on the session route and on a guarded page", async () => {
    fakeServer({ "GET /api/me": signedOut, "GET /api/insight/overview": signedOut });
    for (const path of ["/api/me", "/api/insight/overview"]) {
      const res = await request(app).get(path);
      const fake = await fetch(fakeApiOrigin + path);
      expect(res.status, path).toBe(fake.status);
      const fakeBody = (await fake.json()) as { error: { code: string; message: string } };
      expect(res.body.error.code, path).toBe(fakeBody.error.code);
      expect(res.body.error.message, path).toBe(fakeBody.error.message);
    }
  });

  it("answers a route it does not know with the server's not-found code", async () => {
    const server = await request(app).get("/api/no-such-route");
    fakeServer({});
    const fake = await fetch(`${fakeApiOrigin}/api/no-such-route`);
    expect(fake.status).toBe(server.status);
    expect(((await fake.json()) as { error: { code: string } }).error.code).toBe(server.body.error.code);
  });
});
