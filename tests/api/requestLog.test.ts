// Request logs: one JSON line per request with the route as written, never the URL's values or an e-mail
// address; imports and report sends as events with counts and durations. The logger writes into a stream
// the test reads.
import path from "node:path";
import { Writable } from "node:stream";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { jobSchema } from "../../shared/import/api";
import { loadConfig } from "../../server/config";
import type { Db } from "../../server/db/client";
import { createLogger } from "../../server/logging/logger";
import { makeTestApp, makeTestDb, seedPeople, signIn, type Agent } from "../helpers/testApp";

// Import jobs run in a worker thread that starts tsx on first use: allow for a busy machine.
vi.setConfig({ testTimeout: 120_000 });

const lines: string[] = [];
const capture = new Writable({
  write(chunk, _encoding, done) {
    lines.push(...chunk.toString().split("\n").filter(Boolean));
    done();
  },
});
const entries = () => lines.map((line) => JSON.parse(line) as Record<string, unknown>);

let db: Db;
let coordinator: Agent;
let coordinatorId: number;

beforeAll(async () => {
  db = makeTestDb();
  const people = await seedPeople(db);
  coordinatorId = people.users.coordinator.id;
  const app = makeTestApp(db, { logger: createLogger({ logLevel: "info", nodeEnv: "test" }, capture) });
  coordinator = await signIn(app, "coord@test.example");
});
afterAll(() => db.$client.close());

/** The log lines written while `act` ran. */
async function logged(act: () => Promise<unknown>): Promise<{ raw: string[]; parsed: Record<string, unknown>[] }> {
  const from = lines.length;
  await act();
  const raw = lines.slice(from);
  return { raw, parsed: raw.map((line) => JSON.parse(line)) };
}

describe("request log", () => {
  it("writes one JSON line per request with the route pattern, status, duration and user id, and no query values", async () => {
    const { raw, parsed } = await logged(() => coordinator.get("/api/insight/overview?quarter=2026-Q2&site=NORTH&instructor=A1").expect(200));
    expect(parsed).toHaveLength(1);
    expect(parsed[0]).toMatchObject({ level: 30, msg: "request", method: "GET", route: "/api/insight/overview", status: 200, userId: coordinatorId });
    expect(parsed[0].durationMs).toEqual(expect.any(Number));
    expect(raw[0]).not.toMatch(/2026-Q2|NORTH|A1|quarter=|\?/);
    expect(Object.keys(parsed[0]).sort()).toEqual(["durationMs", "level", "method", "msg", "reqId", "route", "service", "status", "time", "userId"]);
  });

  it("names a route with parameters by its pattern, also when the handler refuses", async () => {
    const { parsed } = await logged(() => coordinator.patch("/api/users/987654", { displayName: "Nobody" }).expect(404));
    expect(parsed).toEqual([expect.objectContaining({ method: "PATCH", route: "/api/users/:id", status: 404, userId: coordinatorId })]);
  });

  it("keeps e-mail addresses, cookies and bodies out of the sign-in line; an unknown route has no pattern", async () => {
    const { raw, parsed } = await logged(async () => {
      await signIn(makeTestApp(db, { logger: createLogger({ logLevel: "info", nodeEnv: "test" }, capture) }), "quality@test.example");
      await coordinator.get("/api/no-such-route?email=someone@test.example").expect(404);
    });
    const login = parsed.find((entry) => entry.route === "/api/auth/login");
    expect(login).toMatchObject({ method: "POST", status: 200 });
    expect(parsed.find((entry) => entry.status === 404)).toMatchObject({ method: "GET", route: null });
    expect(raw.join("\n")).not.toMatch(/@|qb\.sid|cookie|password|no-such-route/i);
  });

  it("logs an import job as an event with its counts and duration, without the file name", async () => {
    const { raw, parsed } = await logged(async () => {
      const uploaded = await coordinator.agent
        .post("/api/imports/uploads")
        .set("x-csrf-token", coordinator.csrfToken)
        .field("kind", "classes")
        .attach("file", path.resolve("tests/fixtures/import/classes-valid.csv"), { filename: "classes-valid.csv", contentType: "text/csv" })
        .expect(201);
      const started = await coordinator.post(`/api/imports/uploads/${uploaded.body.upload.id}/import`, {}).expect(202);
      for (let i = 0; i < 600; i++) {
        const job = jobSchema.parse((await coordinator.get(`/api/imports/jobs/${started.body.job.id}`).expect(200)).body.job);
        if (job.status === "done" || job.status === "failed") break;
        await new Promise((resolve) => setTimeout(resolve, 50));
      }
    });
    const event = parsed.find((entry) => entry.event === "import");
    expect(event).toMatchObject({
      msg: "import finished",
      kind: "classes",
      mode: "import",
      status: "imported",
      rowsRead: 3,
      inserted: 3,
      rejected: 0,
      userId: coordinatorId,
    });
    expect(event?.durationMs).toEqual(expect.any(Number));
    expect(parsed.filter((entry) => entry.msg === "request").map((entry) => entry.route)).toContain("/api/imports/jobs/:id");
    expect(raw.join("\n")).not.toMatch(/classes-valid/);
  });

  it("logs a report send as an event with the number of recipients, not their addresses", async () => {
    const generated = await coordinator.post("/api/reports/2026-Q3", {}).expect(201);
    const { raw, parsed } = await logged(() =>
      coordinator.post(`/api/reports/${generated.body.report.id}/send`, { coverNote: "Our quarter.", extraRecipients: ["board@test.example"] }).expect(201),
    );
    // no mail service in this test: the send is recorded as failed, and logged as such
    const event = parsed.find((entry) => entry.event === "report_send");
    expect(event).toMatchObject({ msg: "report send failed", level: 40, period: "2026-Q3", recipients: 2, status: "failed", userId: coordinatorId });
    expect(raw.join("\n")).not.toMatch(/@/);
  });
});

describe("log level", () => {
  it("is info by default, silent in tests, and LOG_LEVEL overrides both", () => {
    expect(loadConfig({}).logLevel).toBe("info");
    expect(loadConfig({ NODE_ENV: "test" }).logLevel).toBe("silent");
    expect(loadConfig({ NODE_ENV: "test", LOG_LEVEL: "debug" }).logLevel).toBe("debug");
    expect(() => loadConfig({ LOG_LEVEL: "loud" })).toThrow(/LOG_LEVEL must be one of fatal, error, warn, info, debug, trace, silent/);
  });

  it("writes nothing below the level", async () => {
    const quiet: string[] = [];
    const stream = new Writable({ write: (chunk, _e, done) => (quiet.push(chunk.toString()), done()) });
    const app = makeTestApp(db, { logger: createLogger({ logLevel: "warn", nodeEnv: "test" }, stream) });
    const agent = await signIn(app, "coord@test.example");
    await agent.get("/api/sites").expect(200);
    await agent.get("/api/no-such-route").expect(404);
    expect(quiet).toEqual([]);
    expect(entries().length).toBeGreaterThan(0);
  });
});
