// Health answers without sign-in, proves the database with a read and names the schema's migration level;
// readiness answers 503 while the database cannot be read or lacks migrations.
import fs from "node:fs";
import path from "node:path";
import request from "supertest";
import { afterEach, describe, expect, it } from "vitest";
import type { Db } from "../../server/db/client";
import { makeTestApp, makeTestDb } from "../helpers/testApp";

const root = path.resolve(__dirname, "../..");
const packageVersion = JSON.parse(fs.readFileSync(path.join(root, "package.json"), "utf8")).version;
const journal = JSON.parse(fs.readFileSync(path.join(root, "drizzle/meta/_journal.json"), "utf8")).entries as { tag: string }[];
const latestTag = journal[journal.length - 1].tag;

const open: Db[] = [];
function freshDb() {
  const db = makeTestDb();
  open.push(db);
  return db;
}
afterEach(() => {
  for (const db of open.splice(0)) if (db.$client.open) db.$client.close();
});

describe("/api/health", () => {
  it("reports version, the latest applied migration and uptime, without a session", async () => {
    const app = makeTestApp(freshDb());
    const res = await request(app).get("/api/health").expect(200);
    expect(res.body).toMatchObject({
      ok: true,
      version: packageVersion,
      database: { ok: true, migration: { applied: latestTag, appliedCount: journal.length, latest: latestTag, current: true } },
    });
    expect(res.body.uptimeSeconds).toBeGreaterThanOrEqual(0);
    expect(res.headers["set-cookie"]).toBeUndefined();
  });

  it("says so when the database cannot be read, without SQLite's message", async () => {
    const db = freshDb();
    const app = makeTestApp(db);
    db.$client.close();
    const res = await request(app).get("/api/health").expect(200);
    expect(res.body).toEqual({ ok: false, version: packageVersion, uptimeSeconds: expect.any(Number), database: { ok: false } });
  });
});

describe("/api/health/ready", () => {
  it("is 200 on a migrated, open database", async () => {
    const res = await request(makeTestApp(freshDb())).get("/api/health/ready").expect(200);
    expect(res.body).toMatchObject({ ready: true, ok: true });
  });

  it("is 503 once the connection is closed", async () => {
    const db = freshDb();
    const app = makeTestApp(db);
    await request(app).get("/api/health/ready").expect(200);
    db.$client.close();
    const res = await request(app).get("/api/health/ready").expect(503);
    expect(res.body).toMatchObject({ ready: false, reason: "The database cannot be read.", database: { ok: false } });
  });

  it("is 503 while the database lacks a migration this program ships", async () => {
    const db = freshDb();
    const app = makeTestApp(db);
    db.$client.exec("DELETE FROM __drizzle_migrations WHERE created_at = (SELECT max(created_at) FROM __drizzle_migrations)");
    const res = await request(app).get("/api/health/ready").expect(503);
    expect(res.body).toMatchObject({
      ready: false,
      reason: "Database migrations have not all been applied.",
      database: { migration: { current: false, latest: latestTag } },
    });
    expect(res.body.database.migration.applied).toBe(journal[journal.length - 2].tag);
  });
});
