// The attacker's view of disclosure control: for the instructor and funder roles, ask every overview,
// standing and equipment question the role may ask, collect every count shown, and solve the linear
// equations they make for hidden small groups (./disclosureSolver). Run on the demo network and on a planted
// network holding the small cells that subtraction used to reveal: one colleague's 3 child attempts in one
// feedback display, one colleague's 11 attempts on a manikin, and a colleague's 3 attempts on another.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import type { InsightFilters } from "../../shared/filters";
import { previousPeriod } from "../../shared/period";
import { patientTypes } from "../../shared/scoring/policy";
import { feedbackModes } from "../../shared/domain";
import { equipmentAnswerSchema } from "../../shared/schemas/equipment";
import type { OverviewAnswer, StandingAnswer } from "../../shared/schemas/insight";
import type { CurrentUser } from "../../shared/schemas/auth";
import { openDatabase, type Db } from "../../server/db/client";
import { buildDirectory } from "../../server/demo/directory";
import { DEMO_SCENARIO } from "../../server/demo/scenario";
import { resolveFilters, type ResolvedFilters } from "../../server/insight/filters";
import { filterOptions } from "../../server/insight/options";
import { overview } from "../../server/insight/overview";
import { standing } from "../../server/insight/standing";
import { viewerOf, type Viewer } from "../../server/insight/viewer";
import { currentPolicy } from "../../server/policy/service";
import { seedDemo } from "../../server/seed/seedDemo";
import { findActiveUser } from "../../server/users/service";
import { users } from "../../server/db/schema";
import { makeTestApp, makeTestDb, signIn, tempDbFile, TEST_PASSWORD, type Agent } from "../helpers/testApp";
import { insertClass, seedInsightNetwork, type InsightNetwork, type Spec } from "../fixtures/insight/network";
import { derivableUnsafeGroups, type SafetyRule, type TruthCell } from "./disclosureSolver";

// ------------------------------------------------------------------------------------------------------
// The truth, read straight from the attempts (a test may scan them; the product reads the summaries)

interface Truth {
  cells: { key: string; coords: [string, number, string, string, number]; byInstructor: Map<number, { n: number; judged: number }> }[];
}

function truthOf(db: Db): Truth {
  const rows = db.$client
    .prepare(
      `SELECT quarter, site_id AS siteId, profile, feedback, coalesce(manikin_id, 0) AS manikinId, instructor_id AS instructorId,
              count(*) AS n, sum(instructor_result IS NOT NULL) AS judged
         FROM attempts GROUP BY 1, 2, 3, 4, 5, 6`,
    )
    .all() as { quarter: string; siteId: number; profile: string; feedback: string; manikinId: number; instructorId: number; n: number; judged: number }[];
  const cells = new Map<string, Truth["cells"][number]>();
  for (const row of rows) {
    const coords: [string, number, string, string, number] = [row.quarter, row.siteId, row.profile, row.feedback, row.manikinId];
    const key = coords.join("|");
    if (!cells.has(key)) cells.set(key, { key, coords, byInstructor: new Map() });
    cells.get(key)!.byInstructor.set(row.instructorId, { n: row.n, judged: row.judged });
  }
  return { cells: [...cells.values()] };
}

interface Scope {
  from: string;
  to: string;
  siteId: number | null;
  profile: string | null;
  feedback: string | null;
  manikinId: number | null;
}

const scopeOfFilters = (f: ResolvedFilters, range: { from: string; to: string } = f.period): Scope => ({
  from: range.from,
  to: range.to,
  siteId: f.siteId,
  profile: f.profile,
  feedback: f.feedback,
  manikinId: f.manikinId,
});

function cellsIn(truth: Truth, scope: Scope) {
  return truth.cells.filter(
    ({ coords: [quarter, siteId, profile, feedback, manikinId] }) =>
      quarter >= scope.from &&
      quarter <= scope.to &&
      (scope.siteId === null || siteId === scope.siteId) &&
      (scope.profile === null || profile === scope.profile) &&
      (scope.feedback === null || feedback === scope.feedback) &&
      (scope.manikinId === null || manikinId === scope.manikinId),
  );
}

type Measure = "n" | "judged";

/** A figure the viewer was shown: the cells it sums and the count it gave. */
interface ShownFigure {
  measure: Measure;
  scope: Scope;
  value: number | null;
  where: string;
}

// ------------------------------------------------------------------------------------------------------
// Collecting what each answer shows

function figuresOfOverview(answer: OverviewAnswer, f: ResolvedFilters, where: string): ShownFigure[] {
  const shown: ShownFigure[] = [];
  if (!answer.suppressed) shown.push({ measure: "n", scope: scopeOfFilters(f), value: answer.attempts, where });
  if (!answer.passRateChange.previous.suppressed) {
    shown.push({ measure: "n", scope: scopeOfFilters(f, previousPeriod(f.period)), value: answer.passRateChange.previous.n, where: `${where} previous` });
  }
  for (const group of answer.feedback) {
    if (group.suppressed || (f.feedback !== null && f.feedback !== group.mode)) continue;
    shown.push({ measure: "n", scope: { ...scopeOfFilters(f), feedback: group.mode }, value: group.attempts, where: `${where} feedback=${group.mode}` });
  }
  for (const point of answer.series.points) {
    if (!point.suppressed)
      shown.push({
        measure: "n",
        scope: scopeOfFilters(f, { from: point.quarter, to: point.quarter }),
        value: point.attempts,
        where: `${where} series ${point.quarter}`,
      });
  }
  if (!answer.agreement.suppressed) shown.push({ measure: "judged", scope: scopeOfFilters(f), value: answer.agreement.pairs, where: `${where} agreement` });
  return shown;
}

/** The standing's network figures are rates and medians over the scope: a shown set with no count to check. */
function figuresOfStanding(answer: StandingAnswer, f: ResolvedFilters, where: string): ShownFigure[] {
  return answer.errorProfile.networkSuppressed ? [] : [{ measure: "n", scope: scopeOfFilters(f), value: null, where: `${where} standing` }];
}

/** Every period a page can ask for: each quarter and each from/to range of the quarters with data. */
function periods(quarters: readonly string[]): Pick<InsightFilters, "quarter" | "from" | "to">[] {
  const sorted = [...quarters].sort();
  const result: Pick<InsightFilters, "quarter" | "from" | "to">[] = sorted.map((quarter) => ({ quarter }));
  for (let i = 0; i < sorted.length; i++) for (let j = i + 1; j < sorted.length; j++) result.push({ from: sorted[i], to: sorted[j] });
  return result;
}

interface Enumeration {
  figures: ShownFigure[];
  questions: number;
}

/**
 * Every question of the overview and standing the viewer may ask: each period × site × patient type ×
 * display, and each of the manikins the options offer them with each quarter × patient type × display.
 * Filters the role may not use are refused (checked separately below) and so are left out here.
 */
function enumerate(db: Db, viewer: Viewer, withStanding: boolean): Enumeration {
  const options = filterOptions(db, viewer);
  const sites: (string | undefined)[] = [undefined, ...options.sites.map((s) => s.code)];
  const profiles = [undefined, ...options.patientTypes];
  const feedbacks = [undefined, ...options.feedbackModes];
  const figures: ShownFigure[] = [];
  let questions = 0;
  const ask = (query: InsightFilters) => {
    const f = resolveFilters(db, query, viewer);
    const where = JSON.stringify(query);
    figures.push(...figuresOfOverview(overview(db, viewer, f), f, where));
    if (withStanding) figures.push(...figuresOfStanding(standing(db, viewer, f), f, where));
    questions++;
  };
  for (const period of periods(options.quarters)) {
    for (const site of sites) for (const profile of profiles) for (const feedback of feedbacks) ask({ ...period, site, profile, feedback });
  }
  for (const manikin of options.manikins) {
    for (const quarter of options.quarters)
      for (const profile of profiles) for (const feedback of feedbacks) ask({ quarter, manikin: manikin.assetId, profile, feedback });
  }
  return { figures, questions };
}

/**
 * A funder's questions: the options offer them no site and no manikin (and the filters refuse both), so
 * each period × patient type × display, asked of the same service the pages use.
 */
function funderFigures(db: Db, viewer: Viewer): ShownFigure[] {
  const figures: ShownFigure[] = [];
  for (const period of periods(filterOptions(db, viewer).quarters)) {
    for (const profile of [undefined, ...patientTypes]) {
      for (const feedback of [undefined, ...feedbackModes]) {
        const f = resolveFilters(db, { ...period, profile, feedback }, viewer);
        figures.push(...figuresOfOverview(overview(db, viewer, f), f, JSON.stringify({ ...period, profile, feedback })));
      }
    }
  }
  return figures;
}

/** Equipment answers: each manikin's attempts per quarter of the trend window, for each quarter asked. */
async function equipmentFigures(agent: Agent, quarters: readonly string[]): Promise<ShownFigure[]> {
  const figures: ShownFigure[] = [];
  for (const quarter of quarters) {
    const answer = equipmentAnswerSchema.parse((await agent.get(`/api/equipment?quarter=${quarter}`).expect(200)).body);
    for (const m of answer.fleet) {
      for (const u of m.usage) {
        if (u.attempts === null) continue;
        figures.push({
          measure: "n",
          scope: { from: u.quarter, to: u.quarter, siteId: null, profile: null, feedback: null, manikinId: m.id },
          value: u.attempts,
          where: `equipment ${m.assetId} ${u.quarter}`,
        });
      }
    }
  }
  return figures;
}

// ------------------------------------------------------------------------------------------------------
// The attack

function ruleOf(db: Db): SafetyRule {
  const policy = currentPolicy(db).policy;
  return { minCount: policy.suppressionMinCount, minInstructors: policy.suppressionMinInstructors };
}

/** Others' attempts (or judged attempts) per cell, as the viewer sees them: their own subtracted. */
function truthCellsFor(truth: Truth, viewer: Viewer, measure: Measure): TruthCell[] {
  return truth.cells.map((cell) => ({
    key: cell.key,
    others: new Map(
      [...cell.byInstructor].filter(([id, counts]) => id !== viewer.ownInstructorId && counts[measure] > 0).map(([id, counts]) => [id, counts[measure]]),
    ),
  }));
}

/** Every shown count is the sum of its cells (so the cell model is the one the answers use), then the solve. */
function attack(db: Db, truth: Truth, viewer: Viewer, figures: readonly ShownFigure[]) {
  for (const figure of figures) {
    if (figure.value === null) continue;
    const expected = cellsIn(truth, figure.scope).reduce((sum, cell) => sum + [...cell.byInstructor.values()].reduce((s, c) => s + c[figure.measure], 0), 0);
    expect({ where: figure.where, value: figure.value }).toEqual({ where: figure.where, value: expected });
  }
  const rule = ruleOf(db);
  return (["n", "judged"] as const).flatMap((measure) =>
    derivableUnsafeGroups(
      truthCellsFor(truth, viewer, measure),
      figures.filter((figure) => figure.measure === measure).map((figure) => cellsIn(truth, figure.scope).map((cell) => cell.key)),
      rule,
    ).map((found) => ({ measure, ...found })),
  );
}

function viewerFor(db: Db, userId: number): Viewer {
  return viewerOf(db, findActiveUser(db, userId) as CurrentUser);
}

// ------------------------------------------------------------------------------------------------------
// The planted network: the insight fixture plus the cells that used to leak

interface Planted {
  db: Db;
  net: InsightNetwork;
  agents: { instructor: Agent; coordinator: Agent; funder: Agent };
  mkN3: number;
  mkN4: number;
}

async function plantNetwork(): Promise<Planted> {
  const db = makeTestDb();
  const net = await seedInsightNetwork(db);
  const { north } = net.sites;
  const { a1, b1, c1, d1 } = net.instructors;
  const manikin = (assetId: string, siteId: number) =>
    db.$client
      .prepare("INSERT INTO manikins (asset_id, patient_type, site_id, in_service_since) VALUES (?, 'child', ?, '2024-01-01') RETURNING id")
      .get(assetId, siteId) as { id: number };
  const mkN3 = manikin("MK-N3", north.id).id;
  const mkN4 = manikin("MK-N4", north.id).id;
  const q = "2026-Q2";
  const pass: Spec = ["pass", 85];
  const shallow: Spec = ["shallow", 70];
  const klass = (id: string, instructorId: number, manikinId: number, specs: { spec: Spec; feedback: "live" | "hidden" }[]) =>
    insertClass(db, {
      id,
      date: "2026-05-25",
      quarter: q,
      siteId: north.id,
      instructorId,
      course: "child",
      profile: "child",
      learners: specs.length,
      passed: 0,
      manikinId,
      attempts: specs,
    });
  const live = (specs: Spec[]) => specs.map((spec) => ({ spec, feedback: "live" as const }));
  // NORTH child, live: A1 4, B1 5, D1 4 (13 attempts, 7 passed); hidden: C1 alone, 3 attempts, 2 passed
  klass("P-A1", a1.id, mkN3, live([pass, pass, shallow, shallow]));
  klass("P-B1", b1.id, mkN3, live([pass, pass, pass, shallow, shallow]));
  klass("P-D1", d1.id, mkN3, live([pass, pass, shallow, shallow]));
  klass(
    "P-C1",
    c1.id,
    mkN3,
    [pass, pass, shallow].map((spec) => ({ spec, feedback: "hidden" as const })),
  );
  // MK-N4: eleven attempts, all C1's, in 2025-Q4 (a "network" of one colleague)
  insertClass(db, {
    id: "P-C1-N4",
    date: "2025-11-20",
    quarter: "2025-Q4",
    siteId: north.id,
    instructorId: c1.id,
    course: "child",
    profile: "child",
    learners: 11,
    passed: 0,
    manikinId: mkN4,
    attempts: live(Array.from({ length: 11 }, () => shallow)),
  });
  const app = makeTestApp(db);
  return {
    db,
    net,
    mkN3,
    mkN4,
    agents: {
      instructor: await signIn(app, "a1@test.example"),
      coordinator: await signIn(app, "coord@test.example"),
      funder: await signIn(app, "funder@test.example"),
    },
  };
}

let planted: Planted;
beforeAll(async () => {
  planted = await plantNetwork();
}, 60_000);

describe("the planted small cells", () => {
  it("would be given away by subtraction under a rule that judges each answer alone (the solver finds leaks)", () => {
    // the old rule: an answer hidden when others' attempts in it are 1 to 4, judged answer by answer
    const { db } = planted;
    const truth = truthOf(db);
    const viewer = viewerFor(db, planted.net.users.instructor.id);
    const others = (scope: Scope) =>
      cellsIn(truth, scope).reduce((sum, c) => sum + [...c.byInstructor].filter(([id]) => id !== viewer.ownInstructorId).reduce((s, [, v]) => s + v.n, 0), 0);
    const north = planted.net.sites.north.id;
    const asked: Scope[] = [
      { from: "2026-Q2", to: "2026-Q2", siteId: north, profile: "child", feedback: null, manikinId: null },
      { from: "2026-Q2", to: "2026-Q2", siteId: north, profile: "child", feedback: "live", manikinId: null },
    ];
    const shown = asked.filter((scope) => !(others(scope) > 0 && others(scope) < 5)).map((scope) => cellsIn(truth, scope).map((cell) => cell.key));
    expect(shown).toHaveLength(2);
    const leaks = derivableUnsafeGroups(truthCellsFor(truth, viewer, "n"), shown, { minCount: 5, minInstructors: 1 });
    expect(leaks.map((leak) => leak.cells)).toContainEqual([`2026-Q2|${north}|child|hidden|${planted.mkN3}`]);
  });

  it("gives instructor A1 nothing to solve for: every question of the overview, standing and equipment", async () => {
    const { db } = planted;
    const viewer = viewerFor(db, planted.net.users.instructor.id);
    const { figures, questions } = enumerate(db, viewer, true);
    const equipment = await equipmentFigures(planted.agents.instructor, filterOptions(db, viewer).quarters);
    expect(questions).toBeGreaterThan(500);
    expect(figures.length).toBeGreaterThan(questions);
    expect(attack(db, truthOf(db), viewer, [...figures, ...equipment])).toEqual([]);
  });

  it("gives the funder nothing to solve for, through the same services", () => {
    const { db } = planted;
    const viewer = viewerFor(db, planted.net.users.funder.id);
    const figures = funderFigures(db, viewer);
    expect(figures.length).toBeGreaterThan(100);
    expect(attack(db, truthOf(db), viewer, figures)).toEqual([]);
  });

  it("hides the child figures at NORTH that subtraction used to reveal, and keeps the site whole", async () => {
    const get = async (query: string) =>
      (await planted.agents.instructor.get(`/api/insight/overview?quarter=2026-Q2&site=NORTH&${query}`).expect(200)).body as OverviewAnswer;
    const child = await get("profile=child");
    const childLive = await get("profile=child&feedback=live");
    // never both: one of them minus the other would be C1's 3 hidden-display attempts
    expect(child.suppressed && childLive.suppressed).toBe(true);
    expect(childLive.passRate).toEqual({ successes: null, n: null, rate: null, low: null, high: null, suppressed: true });
    // the coordinator sees both
    const coordinator = (await planted.agents.coordinator.get("/api/insight/overview?quarter=2026-Q2&site=NORTH&profile=child&feedback=live").expect(200))
      .body as OverviewAnswer;
    expect(coordinator).toMatchObject({ suppressed: false, attempts: 13, passRate: { successes: 7 } });
  });
});

describe("a group of one colleague", () => {
  it("hides a manikin whose attempts are all one other instructor's, however many there are", async () => {
    const res = await planted.agents.instructor.get("/api/insight/overview?quarter=2025-Q4&manikin=MK-N4").expect(200);
    expect(res.body).toMatchObject({ suppressed: true, attempts: null, medianScore: null });
    expect(res.body.agreement).toMatchObject({ suppressed: true, table: null });
    // 11 attempts: the count rule alone would show them; the coordinator does see them
    expect((await planted.agents.coordinator.get("/api/insight/overview?quarter=2025-Q4&manikin=MK-N4").expect(200)).body).toMatchObject({
      suppressed: false,
      attempts: 11,
    });
  });

  it("shows no standing point that is one colleague", async () => {
    const res = await planted.agents.instructor.get("/api/insight/standing?quarter=2026-Q2&site=NORTH&profile=child").expect(200);
    const answer = res.body as StandingAnswer;
    // B1 has 5 child attempts at NORTH: one point of others would be B1
    expect(answer.spread.points.filter((point) => !point.isMe)).toEqual([]);
    expect(answer.metrics.every((metric) => metric.percentileRank === null)).toBe(true);
  });

  it("hides other instructors' use of a manikin from an instructor's equipment view, not from the coordinator", async () => {
    const usage = async (agent: Agent, assetId: string, quarter: string) => {
      const answer = equipmentAnswerSchema.parse((await agent.get("/api/equipment?quarter=2026-Q2").expect(200)).body);
      return answer.fleet.find((m) => m.assetId === assetId)?.usage.find((u) => u.quarter === quarter);
    };
    // MK-N3 in 2026-Q2: A1's 4 and 12 of three colleagues' (B1 5, D1 4, C1 3) — a group; MK-N4 in 2025-Q4: C1's 11 only
    expect(await usage(planted.agents.instructor, "MK-N4", "2025-Q4")).toEqual({ quarter: "2025-Q4", attempts: null, compressions: null });
    expect(await usage(planted.agents.coordinator, "MK-N4", "2025-Q4")).toMatchObject({ attempts: 11 });
    // MK-N2 in 2026-Q2: C1's 4 infant attempts, fewer than 5
    expect(await usage(planted.agents.instructor, "MK-N2", "2026-Q2")).toMatchObject({ attempts: null });
    // MK-N1 holds A1's own attempts only: nothing of anyone else's, shown
    expect(await usage(planted.agents.instructor, "MK-N1", "2026-Q2")).toMatchObject({ attempts: 10 });
  });
});

describe("the manikin filter", () => {
  it("takes only the manikins the options offer an instructor (their own site's), refusing the rest alike", async () => {
    const options = (await planted.agents.instructor.get("/api/insight/options").expect(200)).body as { manikins: { assetId: string }[] };
    expect(options.manikins.map((m) => m.assetId).sort()).toEqual(["MK-N1", "MK-N2", "MK-N3", "MK-N4"]);
    for (const route of ["/api/insight/overview", "/api/insight/standing", "/api/equipment"]) {
      // another site's manikin and a manikin that does not exist get the same answer
      for (const manikin of ["MK-S1", String(planted.net.manikins.mkS1), "MK-404"]) {
        const res = await planted.agents.instructor.get(`${route}?manikin=${manikin}`);
        expect({ route, manikin, status: res.status }).toEqual({ route, manikin, status: 403 });
      }
      await planted.agents.instructor.get(`${route}?manikin=MK-N1`).expect(200);
    }
  });

  it("is refused to a funder, as every network route is", async () => {
    for (const route of ["/api/insight/overview?quarter=2026-Q2", "/api/insight/overview?manikin=MK-N1", "/api/insight/standing", "/api/equipment"]) {
      await planted.agents.funder.get(route).expect(403);
    }
  });
});

// ------------------------------------------------------------------------------------------------------
// The demo network

describe("the demo network", () => {
  let db: Db;
  let truth: Truth;
  const instructorsOf = (count: number) =>
    buildDirectory(DEMO_SCENARIO)
      .accounts.filter((a) => a.role === "instructor")
      .slice(0, count);

  beforeAll(async () => {
    db = openDatabase(tempDbFile("qb-differencing"));
    await seedDemo(db, { today: "2026-12-01" });
    truth = truthOf(db);
  }, 180_000);
  afterAll(() => db.$client.close());

  const idOf = (email: string) =>
    db
      .select({ id: users.id })
      .from(users)
      .where(sql`${users.email} = ${email}`)
      .get()!.id;

  it("gives two demo instructors nothing to solve for over every overview and equipment question", async () => {
    const app = makeTestApp(db);
    for (const account of instructorsOf(2)) {
      const viewer = viewerFor(db, idOf(account.email));
      const { figures, questions } = enumerate(db, viewer, false);
      const agent = await signIn(app, account.email, account.password ?? TEST_PASSWORD);
      const equipment = await equipmentFigures(agent, filterOptions(db, viewer).quarters.slice(0, 2));
      expect(questions).toBeGreaterThan(1000);
      expect({ instructor: account.email, leaks: attack(db, truth, viewer, [...figures, ...equipment]) }).toEqual({ instructor: account.email, leaks: [] });
      // and the network's own figures stay on the page: each quarter's overview is shown
      const latest = resolveFilters(db, {}, viewer);
      expect(overview(db, viewer, latest).suppressed).toBe(false);
    }
  }, 600_000);

  it("gives the demo funder account nothing to solve for", () => {
    const funder = buildDirectory(DEMO_SCENARIO).accounts.find((a) => a.role === "funder")!;
    const viewer = viewerFor(db, idOf(funder.email));
    const figures = funderFigures(db, viewer);
    expect(figures.length).toBeGreaterThan(100);
    expect(attack(db, truth, viewer, figures)).toEqual([]);
  }, 300_000);
});
