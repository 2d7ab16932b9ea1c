// Who may call what: every API route, signed out and as each role, with the status it must answer.
// Append new routes to `matrix` (one row each); `rowScoped` holds the answers that depend on whose row it is.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DEFAULT_POLICY } from "../../shared/scoring/policy";
import { anonymousAgent, type Agent } from "../helpers/testApp";
import { startInsightApp, type InsightTestContext } from "../fixtures/insight/setup";

type Role = "signedOut" | "coordinator" | "quality_lead" | "instructor" | "funder";
type Method = "get" | "post" | "put" | "patch" | "delete";

interface Row {
  method: Method;
  /** A path, or one built from the fixture's ids. */
  path: string | ((t: InsightTestContext) => string);
  body?: object;
  /** Expected status per role; signed out is always 401. */
  expect: Record<Exclude<Role, "signedOut">, number>;
}

const everyone = { coordinator: 200, quality_lead: 200, instructor: 200, funder: 200 };
const coordinatorOnly = { coordinator: 200, quality_lead: 403, instructor: 403, funder: 403 };
const directory = { coordinator: 200, quality_lead: 200, instructor: 403, funder: 403 };
const network = { coordinator: 200, quality_lead: 200, instructor: 200, funder: 403 };
const drillDown = directory;
const instructorOnly = { coordinator: 403, quality_lead: 403, instructor: 200, funder: 403 };
const alertReaders = network;

const matrix: Row[] = [
  { method: "get", path: "/api/me", expect: everyone },
  { method: "get", path: "/api/users", expect: coordinatorOnly },
  { method: "get", path: "/api/sites", expect: directory },
  { method: "get", path: "/api/instructors", expect: directory },
  { method: "get", path: "/api/data-version", expect: everyone },
  { method: "get", path: "/api/insight/options", expect: everyone },
  { method: "get", path: "/api/insight/overview", expect: network },
  { method: "get", path: "/api/insight/standing", expect: instructorOnly },
  { method: "get", path: "/api/insight/instructors", expect: drillDown },
  { method: "get", path: (t) => `/api/insight/instructors/${t.net.instructors.a1.id}`, expect: drillDown },
  { method: "get", path: "/api/insight/errors?error=too_shallow", expect: drillDown },
  { method: "get", path: "/api/classes/A1-2604", expect: network },
  { method: "get", path: "/api/attempts", expect: network },
  { method: "get", path: "/api/attempts/A1-2604-001", expect: network },
  { method: "get", path: "/api/attempts.csv", expect: network },
  { method: "get", path: "/api/equipment", expect: network },
  { method: "get", path: "/api/equipment/drift", expect: network },
  { method: "get", path: "/api/equipment/manikins/MK-N1", expect: network },
  { method: "get", path: "/api/learners/retention", expect: drillDown },
  { method: "get", path: "/api/learners/calibration", expect: network },
  { method: "get", path: "/api/settings/policy", expect: directory },
  { method: "get", path: "/api/settings/policy/versions", expect: directory },
  { method: "put", path: "/api/settings/policy", body: { policy: DEFAULT_POLICY, note: "Same as before" }, expect: coordinatorOnly },
  { method: "post", path: "/api/settings/rescore", body: {}, expect: coordinatorOnly },
  { method: "get", path: "/api/settings/chart-baseline", expect: directory },
  { method: "put", path: "/api/settings/chart-baseline", body: { baseline: null }, expect: coordinatorOnly },
  { method: "patch", path: "/api/me", body: { lengthUnit: "mm" }, expect: everyone },
  { method: "get", path: "/api/imports/formats", expect: { coordinator: 200, quality_lead: 403, instructor: 200, funder: 403 } },
  { method: "get", path: "/api/imports/batches", expect: { coordinator: 200, quality_lead: 403, instructor: 200, funder: 403 } },
  { method: "get", path: "/api/imports/presets", expect: { coordinator: 200, quality_lead: 403, instructor: 200, funder: 403 } },
  { method: "get", path: "/api/reports", expect: { coordinator: 200, quality_lead: 403, instructor: 403, funder: 200 } },
  { method: "get", path: "/api/reports/2026-Q2/preview", expect: coordinatorOnly },
  { method: "get", path: "/api/reports/2026-Q2/notes", expect: { coordinator: 200, quality_lead: 403, instructor: 403, funder: 200 } },
  { method: "put", path: "/api/reports/2026-Q2/notes", body: { actions: "Depth drill first" }, expect: coordinatorOnly },
  { method: "get", path: "/api/report-sends", expect: coordinatorOnly },
  { method: "get", path: "/api/outbox", expect: coordinatorOnly },
  { method: "get", path: "/api/system", expect: coordinatorOnly },
  { method: "get", path: "/api/actions", expect: network },
  { method: "get", path: "/api/actions/marks", expect: network },
  { method: "get", path: "/api/tracker", expect: coordinatorOnly },
  { method: "get", path: "/api/me/alerts", expect: alertReaders },
  { method: "put", path: "/api/me/alerts", body: { kinds: ["service"] }, expect: alertReaders },
  { method: "get", path: "/api/alerts", expect: alertReaders },
  { method: "get", path: "/api/alerts/all", expect: coordinatorOnly },
];

/** Row scope: an instructor asking for another instructor's row is told it does not exist. */
const rowScoped: { path: string; as: "instructor" | "otherInstructor"; status: number }[] = [
  { path: "/api/classes/B1-2605", as: "instructor", status: 404 },
  { path: "/api/attempts/B1-2605-001", as: "instructor", status: 404 },
  { path: "/api/classes/A1-2604", as: "otherInstructor", status: 404 },
  { path: "/api/attempts/A1-2604-001", as: "otherInstructor", status: 404 },
  { path: "/api/insight/overview?instructor=B1", as: "instructor", status: 403 },
  { path: "/api/equipment?site=SOUTH", as: "instructor", status: 403 },
  { path: "/api/equipment/drift?site=SOUTH", as: "instructor", status: 403 },
  { path: "/api/equipment/manikins/MK-S1", as: "instructor", status: 404 },
  { path: "/api/equipment/manikins/MK-N1", as: "otherInstructor", status: 404 },
  { path: "/api/learners/calibration?instructor=B1", as: "instructor", status: 403 },
];

let t: InsightTestContext;
let agents: Record<Role, Agent>;
beforeAll(async () => {
  t = await startInsightApp();
  agents = {
    signedOut: await anonymousAgent(t.app),
    coordinator: t.coordinator,
    quality_lead: t.quality,
    instructor: t.instructor,
    funder: t.funder,
  };
});
afterAll(() => t.db.$client.close());

async function call(agent: Agent, row: Pick<Row, "method" | "body">, path: string) {
  const res = await (row.method === "get" || row.method === "delete" ? agent[row.method](path) : agent[row.method](path, row.body));
  // GET /api/me hands out a fresh CSRF token; later state-changing calls must send that one
  if (typeof res.body?.csrfToken === "string") agent.csrfToken = res.body.csrfToken;
  return res;
}

describe("route × role", () => {
  const cases = matrix.flatMap((row) =>
    (["signedOut", "coordinator", "quality_lead", "instructor", "funder"] as const).map((role) => ({
      row,
      role,
      status: role === "signedOut" ? 401 : row.expect[role],
      label: `${row.method.toUpperCase()} ${typeof row.path === "string" ? row.path : row.path.toString().replace(/^.*=>\s*/, "")} as ${role}`,
    })),
  );
  it.each(cases)("$label → $status", async ({ row, role, status }) => {
    const path = typeof row.path === "string" ? row.path : row.path(t);
    const res = await call(agents[role], row, path);
    expect(res.status, JSON.stringify(res.body)).toBe(status);
  });
});

describe("row scope", () => {
  it.each(rowScoped)("$path as $as → $status", async ({ path, as, status }) => {
    const agent = as === "instructor" ? t.instructor : t.otherInstructor;
    expect((await agent.get(path)).status).toBe(status);
  });
});
