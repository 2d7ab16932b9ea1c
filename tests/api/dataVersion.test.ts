// The data version tells an open page whether the figures may have changed since it last looked: it must
// change when another process (the CLI) imports into the same file, and stay put while nothing is written,
// so pages refetch exactly when they need to.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDatabase, type Db } from "../../server/db/client";
import { CLASSES_FIXTURE, runCli } from "../faults/helpers";
import { makeTestApp, seedPeople, signIn, tempDbFile, type Agent, type TestApp } from "../helpers/testApp";

let dbFile: string;
let db: Db;
let coordinator: Agent;
let funder: Agent;
let app: TestApp;

const versionOf = async (agent: Agent) => {
  const res = await agent.get("/api/data-version");
  expect(res.status).toBe(200);
  expect(res.headers["cache-control"]).toBe("no-store");
  return res.body.version as string;
};

beforeAll(async () => {
  dbFile = tempDbFile("qb-data-version");
  db = openDatabase(dbFile);
  await seedPeople(db);
  app = makeTestApp(db);
  coordinator = await signIn(app, "coord@test.example");
  funder = await signIn(app, "funder@test.example");
}, 60_000);
afterAll(() => db.$client.close());

describe("GET /api/data-version", () => {
  it("stays the same while nothing is written, sign-ins and session writes included", async () => {
    await coordinator.get("/api/insight/overview"); // the first read stores the default scoring policy once
    const first = await versionOf(coordinator);
    await coordinator.get("/api/insight/overview");
    await funder.get("/api/me");
    await signIn(app, "quality@test.example");
    expect(await versionOf(coordinator)).toBe(first);
  });

  it("changes when the CLI imports into the same database file, and the answers follow at once", async () => {
    const before = await versionOf(funder);
    const batchesBefore = (await coordinator.get("/api/imports/batches")).body.total;

    const cli = await runCli(dbFile, ["import", "classes", CLASSES_FIXTURE]);
    expect(cli.code, cli.stderr).toBe(0);

    const after = await versionOf(funder);
    expect(after).not.toBe(before);
    const batchesAfter = (await coordinator.get("/api/imports/batches")).body.total;
    expect(batchesAfter).toBe(batchesBefore + 1);
  }, 60_000);
});
