// SQL-injection strings in every filter of every GET route and in every path id: the answer is a 4xx (or an
// empty result where a filter is free text), never a 500, never database text, and the tables are all still
// there with the same rows afterwards.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Agent } from "../helpers/testApp";
import { startInsightApp, type InsightTestContext } from "../fixtures/insight/setup";
import { rowCounts, tableNames } from "./dbState";
import { fillParams, listRoutes, type RouteEntry } from "./routes";

const INJECTIONS = [
  "' OR 1=1 --",
  "1; DROP TABLE attempts",
  "%' UNION SELECT email, password_hash FROM users --",
  "1 OR 1=1",
  "A1' OR '1'='1",
  '" OR ""="',
  "1); DELETE FROM users; --",
  "2026-Q2' --",
];

const FILTERS = ["quarter", "from", "to", "site", "profile", "feedback", "instructor", "manikin"];

/** The query parameters each GET route reads (an empty list: it reads none). */
const QUERY_KEYS: Record<string, string[]> = {
  "/api/health": [],
  "/api/health/ready": [],
  "/api/auth/csrf": [],
  "/api/me": [],
  "/api/users": [],
  "/api/sites": [],
  "/api/instructors": [],
  "/api/outbox": [],
  "/api/system": [],
  "/api/outbox/:id/attachment/:index": [],
  "/api/settings/policy": [],
  "/api/settings/chart-baseline": [],
  "/api/settings/policy/versions": [],
  "/api/imports/formats": [],
  "/api/imports/uploads/:id": [],
  "/api/imports/jobs/:id": [],
  "/api/imports/jobs/:id/rejected.csv": [],
  "/api/imports/batches": ["limit", "offset", "kind"],
  "/api/imports/batches/:id": [],
  "/api/imports/batches/:id/rejected.csv": [],
  "/api/imports/presets": ["kind"],
  "/api/data-version": [],
  "/api/insight/options": [],
  "/api/insight/overview": [...FILTERS, "limits", "split"],
  "/api/insight/standing": [...FILTERS, "adjust"],
  "/api/insight/instructors": [...FILTERS, "adjust"],
  "/api/insight/instructors/:id": FILTERS,
  "/api/insight/errors": [...FILTERS, "error"],
  "/api/classes/:id": [],
  "/api/attempts": [...FILTERS, "error", "class", "stream", "learner", "learnerMatch", "sort", "dir", "page", "pageSize"],
  "/api/attempts.csv": [...FILTERS, "error", "class", "stream", "learner", "learnerMatch", "sort", "dir"],
  "/api/attempts/:id": [],
  "/api/equipment": FILTERS,
  "/api/equipment/drift": FILTERS,
  "/api/equipment/manikins/:assetId": FILTERS,
  "/api/learners/retention": FILTERS,
  "/api/learners/calibration": FILTERS,
  "/api/reports": ["period"],
  "/api/reports/:period/preview": [],
  "/api/reports/:period/notes": [],
  "/api/reports/:id/data": [],
  "/api/reports/:id/pdf": [],
  "/api/reports/:id/csv": [],
  "/api/report-sends": [],
  "/api/actions": [],
  "/api/actions/marks": FILTERS,
  "/api/actions/:id": [],
  "/api/actions/:id/monthly": [],
  "/api/tracker": ["quarter"],
  "/api/me/alerts": [],
  "/api/alerts": [],
  "/api/alerts/all": [],
};

/** Free-text filters that may answer 200: then with nothing in the list. */
const EMPTY_WHEN_UNMATCHED: Record<string, (body: Record<string, unknown>) => unknown[]> = {
  "/api/reports period": (body) => body.reports as unknown[],
};

let t: InsightTestContext;
let routes: RouteEntry[];
let tablesBefore: string[];
let countsBefore: Record<string, number>;

beforeAll(async () => {
  t = await startInsightApp();
  routes = listRoutes(t.app);
  tablesBefore = tableNames(t.db);
  countsBefore = rowCounts(t.db);
});
afterAll(() => t.db.$client.close());

const agentFor = (route: string): Agent => (route === "/api/insight/standing" ? t.instructor : t.coordinator);

/** No stack, no database error text and no stored secret in what the client sees (echoing the input is fine). */
function expectNoLeak(text: string, label: string) {
  expect(text, label).not.toMatch(/SQLITE_|SqliteError|syntax error|no such (table|column)|unrecognized token/i);
  expect(text, label).not.toContain("scrypt$");
  expect(text, label).not.toMatch(/\n\s+at .+\(.+:\d+:\d+\)/);
}

describe("the injection table", () => {
  it("names the query parameters of every GET route the routers serve", () => {
    const gets = routes
      .filter((r) => r.method === "get")
      .map((r) => r.path)
      .sort();
    expect(gets).toEqual(Object.keys(QUERY_KEYS).sort());
  });
});

describe("injection strings in query filters", () => {
  const cases = Object.entries(QUERY_KEYS).flatMap(([route, keys]) => keys.map((key) => ({ route, key })));
  it.each(cases)("$route ?$key=…", async ({ route, key }) => {
    const agent = agentFor(route);
    const url = fillParams(route, { id: String(t.net.instructors.a1.id), assetId: "MK-N1" });
    for (const payload of INJECTIONS) {
      const res = await agent.get(url).query({ [key]: payload });
      const label = `${url}?${key}=${payload} → ${res.status} ${res.text.slice(0, 200)}`;
      expect(res.status, label).toBeLessThan(500);
      expectNoLeak(res.text, label);
      const empty = EMPTY_WHEN_UNMATCHED[`${route} ${key}`];
      if (empty && res.status === 200) expect(empty(res.body), label).toEqual([]);
      else expect(res.status, label).toBeGreaterThanOrEqual(400);
    }
  });
});

describe("injection strings in path ids", () => {
  it("answers 4xx on every route with a path parameter, whatever the method", async () => {
    const withParams = routes.filter((r) => r.path.includes("/:"));
    expect(withParams.length).toBeGreaterThan(20);
    for (const route of withParams) {
      for (const payload of INJECTIONS) {
        const encoded = encodeURIComponent(payload);
        const url = route.path.replace(/:(\w+)/g, encoded);
        const agent = agentFor(route.path);
        const res = await (route.method === "get" ? agent.get(url) : route.method === "delete" ? agent.delete(url) : agent[route.method](url, {}));
        const label = `${route.method.toUpperCase()} ${url} → ${res.status} ${res.text.slice(0, 200)}`;
        expect(res.status, label).toBeGreaterThanOrEqual(400);
        expect(res.status, label).toBeLessThan(500);
        expectNoLeak(res.text, label);
      }
    }
  });

  it("answers 4xx for ids that are huge, negative, fractional or not numbers", async () => {
    for (const id of ["99999999999999999999999", "-1", "1.5", "0x10", "1e3", "NaN", "Infinity", "%00", "..", "1%0A2"]) {
      for (const path of [`/api/imports/batches/${id}`, `/api/reports/${id}/data`, `/api/insight/instructors/${id}`, `/api/outbox/${id}/attachment/${id}`]) {
        const res = await t.coordinator.get(path);
        expect(res.status, `${path} → ${res.status} ${res.text}`).toBeGreaterThanOrEqual(400);
        expect(res.status, `${path} → ${res.status}`).toBeLessThan(500);
        expectNoLeak(res.text, path);
      }
    }
  });
});

describe("afterwards", () => {
  it("still has every table, with the same rows", () => {
    expect(tableNames(t.db)).toEqual(tablesBefore);
    expect(tablesBefore).toContain("attempts");
    expect(tablesBefore).toContain("users");
    expect(rowCounts(t.db)).toEqual(countsBefore);
    expect(countsBefore.attempts).toBeGreaterThan(0);
  });
});
