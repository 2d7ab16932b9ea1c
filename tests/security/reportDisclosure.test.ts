// The attacker's view of the funder report family: a funder holds every released report, each quarter's and
// each year's, as the API gives them. Every count they show is a sum over cells quarter × category of one
// measure (attempts by patient type × display, judged attempts, errors, attempts with errors, classes and
// learners by course, retention groups); a count shown as "no data" also says each of its cells is zero, and
// a hidden one's label bounds it. The attack solves those equations for hidden small cells
// (./disclosureSolver: is a cell's indicator in the row space of the shown counts?) and propagates the
// labels' bounds over them (./boundsSolver). On the demo network and on a planted network whose small cells the earlier
// per-report rule gave away by subtracting quarters from their year, it finds none; the earlier rule, applied
// to the same planted network, is shown to leak, so the attack can fail.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Test } from "supertest";
import { courseTypes } from "../../shared/domain";
import { quartersOf, parsePeriod } from "../../shared/period";
import type { CountFigure, HiddenReason, ReportData } from "../../shared/schemas/report";
import { attemptErrorNames } from "../../shared/scoring/scoreAttempt";
import { openDatabase, type Db } from "../../server/db/client";
import { retentionBins, retentionByQuarter } from "../../server/metrics/retention";
import { buildReportData } from "../../server/reports/data";
import { renderReportPdf } from "../../server/reports/pdf";
import { seedDemo } from "../../server/seed/seedDemo";
import { buildDirectory } from "../../server/demo/directory";
import { DEMO_SCENARIO } from "../../server/demo/scenario";
import { makeTestApp, makeTestDb, signIn, tempDbFile, type Agent } from "../helpers/testApp";
import { insertClass, seedInsightNetwork, type Spec } from "../fixtures/insight/network";
import { propagateBounds, type BoundedSum } from "./boundsSolver";
import { derivableUnsafeGroups, type TruthCell } from "./disclosureSolver";

const MIN = 5;

// ------------------------------------------------------------------------------------------------------
// The truth, read straight from the tables (a test may scan them; the product reads the summaries)

/** Count per cell key: `measure|quarter|category…`. */
type Truth = Map<string, number>;

function truthOf(db: Db): Truth {
  const truth: Truth = new Map();
  const add = (key: string, n: number) => truth.set(key, (truth.get(key) ?? 0) + n);
  const attemptRows = db.$client
    .prepare(
      "SELECT quarter, profile, feedback, error_mask AS mask, instructor_result IS NOT NULL AS judged, count(*) AS n FROM attempts GROUP BY 1, 2, 3, 4, 5",
    )
    .all() as { quarter: string; profile: string; feedback: string; mask: number; judged: number; n: number }[];
  for (const row of attemptRows) {
    add(`attempts|${row.quarter}|${row.profile}|${row.feedback}`, row.n);
    add(`judged|${row.quarter}`, row.judged ? row.n : 0);
    add(`withErrors|${row.quarter}`, row.mask !== 0 ? row.n : 0);
    attemptErrorNames.forEach((name, bit) => add(`errors|${row.quarter}|${name}`, row.mask & (1 << bit) ? row.n : 0));
  }
  const classRows = db.$client.prepare("SELECT quarter, course, count(*) AS n, sum(learners) AS learners FROM classes GROUP BY 1, 2").all() as {
    quarter: string;
    course: string;
    n: number;
    learners: number;
  }[];
  for (const row of classRows) {
    add(`classes|${row.quarter}|${row.course}`, row.n);
    add(`learners|${row.quarter}|${row.course}`, row.learners);
  }
  const quarters = [...new Set(attemptRows.map((row) => row.quarter))].sort();
  if (quarters.length > 0) {
    for (const [quarter, answer] of retentionByQuarter(db, quarters[0], quarters[quarters.length - 1])) {
      add(`retention|${quarter}|first_time`, answer.first_time.learners);
      for (const bin of retentionBins) add(`retention|${quarter}|${bin}`, answer.returning.find((r) => r.months === bin)!.learners);
    }
  }
  return truth;
}

/** The cell keys of `measure` in `quarters` whose categories start with `category` (every category when omitted). */
function cellsOf(truth: Truth, measure: string, quarters: readonly string[], category?: (parts: string[]) => boolean): string[] {
  return [...truth.keys()].filter((key) => {
    const [m, quarter, ...parts] = key.split("|");
    return m === measure && quarters.includes(quarter) && (category === undefined || category(parts));
  });
}

// ------------------------------------------------------------------------------------------------------
// Every count a report shows, as the cells it sums

/** A count a report shows (value), or hides with a label that still bounds it (hidden). */
interface Shown {
  measure: string;
  cells: string[];
  value: number | null;
  hidden: HiddenReason | null;
  where: string;
}

function figuresOf(data: ReportData, truth: Truth): Shown[] {
  const shown: Shown[] = [];
  const put = (figure: CountFigure, measure: string, quarters: readonly string[], where: string, category?: (parts: string[]) => boolean) => {
    shown.push({ measure, cells: cellsOf(truth, measure, quarters, category), value: figure.value, hidden: figure.hidden, where: `${data.period} ${where}` });
  };
  const q = data.quarters;
  put(data.reach.attempts, "attempts", q, "attempts");
  put(data.passRate.n, "attempts", q, "pass rate n");
  for (const c of data.comparisons) put(c.passRate.n, "attempts", quartersOf(parsePeriod(c.period)!), `comparison ${c.period}`);
  for (const p of data.trend.points) put(p.passRate.n, "attempts", [p.quarter], `trend ${p.quarter}`);
  for (const g of data.byPatientType) {
    put(g.attempts, "attempts", q, `patient type ${g.key}`, ([profile]) => profile === g.key);
    put(g.passRate.n, "attempts", q, `patient type ${g.key} n`, ([profile]) => profile === g.key);
  }
  for (const g of [data.feedback.live, data.feedback.hidden]) {
    put(g.attempts, "attempts", q, `display ${g.key}`, ([, feedback]) => feedback === g.key);
    put(g.passRate.n, "attempts", q, `display ${g.key} n`, ([, feedback]) => feedback === g.key);
  }
  put(data.agreement.pairs, "judged", q, "judged");
  for (const row of data.errors.rows) put(row.count, "errors", q, `error ${row.name}`, ([name]) => name === row.name);
  // a share of all errors gives that total away: count ÷ share
  const withShare = data.errors.rows.find((row) => row.share !== null && row.share > 0 && row.count.value !== null);
  if (withShare) {
    shown.push({
      measure: "errors",
      cells: cellsOf(truth, "errors", q),
      value: Math.round(withShare.count.value! / withShare.share!),
      hidden: null,
      where: `${data.period} errors total`,
    });
  }
  put(data.errors.attemptsWithErrors, "withErrors", q, "attempts with errors");
  put(data.reach.classes, "classes", q, "classes");
  put(data.reach.learners, "learners", q, "learners");
  put(data.agreement.completionRate.n, "learners", q, "completion n");
  for (const c of data.reach.byCourse) {
    put(c.classes, "classes", q, `classes ${c.key}`, ([course]) => course === c.key);
    put(c.learners, "learners", q, `learners ${c.key}`, ([course]) => course === c.key);
  }
  for (const g of [data.retention!.firstTime, ...data.retention!.returning]) {
    put(g.learners, "retention", q, `retention ${g.key}`, ([group]) => group === g.key);
    put(g.firstAttemptPassRate.n, "retention", q, `retention ${g.key} n`, ([group]) => group === g.key);
  }
  return shown;
}

/**
 * Every count shown equals its cells' sum (so the model is the one the reports use); then the solve: the
 * linear one, and the labels' bounds propagated over the same sums. `smallFrom` is the least a "fewer than"
 * count can be: 1 where zero reads "no data", 0 where zero was hidden too.
 */
function attack(truth: Truth, figures: readonly Shown[], smallFrom = 1) {
  const shown = figures.filter((figure): figure is Shown & { value: number } => figure.value !== null);
  for (const figure of shown) {
    const sum = figure.cells.reduce((total, key) => total + truth.get(key)!, 0);
    expect({ where: figure.where, value: figure.value }).toEqual({ where: figure.where, value: sum });
  }
  const measures = [...new Set([...truth.keys()].map((key) => key.split("|")[0]))];
  return measures.flatMap((measure) => {
    const cells: TruthCell[] = [...truth]
      .filter(([key]) => key.startsWith(`${measure}|`))
      .map(([key, n]) => ({ key, others: n > 0 ? new Map([[0, n]]) : new Map() }));
    const sets = shown.filter((figure) => figure.measure === measure && figure.cells.length > 0);
    // counts cannot be negative: a shown zero says each of its cells is zero
    const zeros = sets.filter((figure) => figure.value === 0).flatMap((figure) => figure.cells.map((key) => [key]));
    const linear = derivableUnsafeGroups(cells, [...sets.map((figure) => figure.cells), ...zeros], { minCount: MIN, minInstructors: 1 });
    const sums: BoundedSum[] = figures
      .filter((figure) => figure.measure === measure && figure.cells.length > 0)
      .map((figure) =>
        figure.value !== null
          ? { cells: figure.cells, low: figure.value, high: figure.value }
          : figure.hidden === "small"
            ? { cells: figure.cells, low: smallFrom, high: MIN - 1 }
            : { cells: figure.cells, low: MIN, high: Number.POSITIVE_INFINITY },
      );
    const bounds = propagateBounds(
      cells.map((cell) => cell.key),
      sums,
    );
    const pinned = [...bounds]
      .filter(([key, [low, high]]) => low === high && truth.get(key)! > 0 && truth.get(key)! < MIN)
      .map(([key]) => ({ cells: [key] }))
      .filter((found) => !linear.some((leak) => leak.cells.length === 1 && leak.cells[0] === found.cells[0]));
    return [...linear, ...pinned];
  });
}

/** Every period the family releases: each quarter with classes or attempts, and each of their years. */
function familyPeriods(db: Db): string[] {
  const quarters = (db.$client.prepare("SELECT quarter FROM classes UNION SELECT quarter FROM attempts ORDER BY 1").all() as { quarter: string }[]).map(
    (r) => r.quarter,
  );
  return [...quarters, ...new Set(quarters.map((quarter) => quarter.slice(0, 4)))];
}

/** Supertest collects binary bodies only when given a parser. */
const binary: Parameters<Test["parse"]>[0] = (res, done) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on("data", (chunk: Buffer) => chunks.push(chunk));
  stream.on("end", () => done(null, Buffer.concat(chunks)));
};

/** Generates and releases every report of the family, then reads each as a funder does: the API's data, and the PDF. */
async function releasedToFunder(coordinator: Agent, funder: Agent, periods: readonly string[]) {
  const released: { data: ReportData; pdf: Buffer; version: number; createdAt: string }[] = [];
  for (const period of periods) {
    const version = (await coordinator.post(`/api/reports/${period}`).expect(201)).body.report as { id: number; version: number; createdAt: string };
    await coordinator.post(`/api/reports/${version.id}/release`).expect(200);
    const data = (await funder.get(`/api/reports/${version.id}/data`).expect(200)).body.data as ReportData;
    const pdf = (await funder.get(`/api/reports/${version.id}/pdf`).buffer(true).parse(binary).expect(200)).body as Buffer;
    released.push({ data, pdf, version: version.version, createdAt: version.createdAt });
  }
  return released;
}

// ------------------------------------------------------------------------------------------------------
// The earlier rule, decided report by report, for the planted case: each count below 5 (zeros too) hidden,
// and in a breakdown whose total is shown, the smallest shown cell too while one hidden cell stands alone.

function perReportBreakdown(values: readonly number[]): boolean[] {
  const hidden = values.map((value) => value < MIN);
  while (hidden.filter(Boolean).length === 1) {
    const shownIndices = values.map((value, i) => ({ value, i })).filter(({ i }) => !hidden[i]);
    if (shownIndices.length === 0) break;
    hidden[shownIndices.sort((a, b) => a.value - b.value)[0].i] = true;
  }
  return hidden;
}

/** The child and course counts each report showed under the earlier rule. */
function earlierRuleFigures(truth: Truth, periods: readonly string[]): Shown[] {
  const shown: Shown[] = [];
  for (const period of periods) {
    const quarters = quartersOf(parsePeriod(period)!);
    const sum = (cells: string[]) => cells.reduce((total, key) => total + truth.get(key)!, 0);
    const total = cellsOf(truth, "classes", quarters);
    if (sum(total) >= MIN) shown.push({ measure: "classes", cells: total, value: sum(total), hidden: null, where: `${period} classes` });
    const byCourse = courseTypes.map((course) => cellsOf(truth, "classes", quarters, ([c]) => c === course));
    const hidden = perReportBreakdown(byCourse.map(sum));
    byCourse.forEach((cells, i) => {
      if (!hidden[i]) shown.push({ measure: "classes", cells, value: sum(cells), hidden: null, where: `${period} classes ${courseTypes[i]}` });
    });
  }
  return shown;
}

// ------------------------------------------------------------------------------------------------------
// The planted network (on the insight fixture): 2026 has 7, 7 and 6 child classes in Q1–Q3 and 4 in Q4 (as
// the demo has), and 4 child attempts in 2026-Q3 beside 6 infant and 30 adult ones, with 6 child attempts in
// 2026-Q1.

async function plantNetwork() {
  const db = makeTestDb();
  const net = await seedInsightNetwork(db);
  const { north } = net.sites;
  const { a1, c1 } = net.instructors;
  const pass: Spec = ["pass", 85];
  const shallow: Spec = ["shallow", 70];
  let serial = 0;
  const klass = (quarter: string, date: string, course: "child" | "infant" | "adult" | "all-ages", attempts: Spec[] = []) =>
    insertClass(db, {
      id: `PL-${++serial}`,
      date,
      quarter,
      siteId: north.id,
      instructorId: serial % 2 ? a1.id : c1.id,
      course,
      profile: course === "all-ages" ? "adult" : course,
      learners: Math.max(attempts.length, 6),
      passed: 0,
      manikinId: net.manikins.mkN1,
      attempts: attempts.map((spec) => ({ spec, feedback: "live" as const })),
    });
  const dates = { "2026-Q1": "2026-02-10", "2026-Q2": "2026-05-12", "2026-Q3": "2026-08-11", "2026-Q4": "2026-11-10" } as const;
  const childClasses = { "2026-Q1": 6, "2026-Q2": 7, "2026-Q3": 5, "2026-Q4": 4 } as const;
  for (const [quarter, count] of Object.entries(childClasses) as [keyof typeof dates, number][]) {
    for (let i = 0; i < count; i++) klass(quarter, dates[quarter], "child");
    for (let i = 0; i < 6; i++) klass(quarter, dates[quarter], "all-ages");
  }
  klass("2026-Q1", "2026-02-11", "child", [pass, pass, shallow, shallow, pass, shallow]);
  klass("2026-Q3", "2026-08-12", "child", [pass, shallow, shallow, pass]);
  klass("2026-Q3", "2026-08-13", "infant", [pass, pass, shallow, shallow, pass, shallow]);
  klass(
    "2026-Q3",
    "2026-08-14",
    "adult",
    Array.from({ length: 30 }, (_, i) => (i % 3 ? pass : shallow)),
  );
  const app = makeTestApp(db);
  /** More class logs without attempts, as a later import brings them. */
  const addClasses = (quarter: string, date: string, course: "child" | "adult", count: number) => {
    for (let i = 0; i < count; i++) klass(quarter, date, course);
  };
  return { db, addClasses, coordinator: await signIn(app, "coord@test.example"), funder: await signIn(app, "funder@test.example") };
}

describe("the labels' bounds", () => {
  it("pin a cell that the sums alone leave open, as a reader does by hand (so the bounds attack can fail)", () => {
    // a quarter's hidden child (fewer than 5) and infant (not shown) cells add up to 8; the year's infant
    // count less the other quarters' shown ones gives this quarter's infant 5, and so child 3 — the earlier
    // rule's 2025-Q2 child classes on the demo network, found the same way
    const sums: BoundedSum[] = [
      { cells: ["child", "infant"], low: 8, high: 8 },
      { cells: ["child"], low: 0, high: MIN - 1 },
      { cells: ["infant"], low: MIN, high: Number.POSITIVE_INFINITY },
      { cells: ["infant", "infant elsewhere"], low: 15, high: 15 },
      { cells: ["infant elsewhere"], low: 10, high: 10 },
    ];
    expect(propagateBounds(["child", "infant", "infant elsewhere"], sums).get("child")).toEqual([3, 3]);
    // without the year's infant count, child is only known to be 0 to 3
    expect(propagateBounds(["child", "infant"], sums.slice(0, 3)).get("child")).toEqual([0, 3]);
  });
});

describe("the planted network", () => {
  let planted: Awaited<ReturnType<typeof plantNetwork>>;
  let truth: Truth;
  beforeAll(async () => {
    planted = await plantNetwork();
    truth = truthOf(planted.db);
  }, 60_000);
  afterAll(() => planted.db.$client.close());

  it("gave its hidden cells away under the earlier per-report rule: the year minus its quarters (the attack finds it)", () => {
    const shown = earlierRuleFigures(truth, familyPeriods(planted.db));
    // 2026-Q4's 4 child classes were hidden in its report, but the year's 24 less Q1–Q3's 7 + 7 + 6 is 4
    expect(shown.some((figure) => figure.where === "2026-Q4 classes child")).toBe(false);
    expect(shown.find((figure) => figure.where === "2026 classes child")?.value).toBe(24);
    const leaks = attack(truth, shown);
    expect(leaks.map((leak) => leak.cells)).toContainEqual(["classes|2026-Q4|child"]);
  });

  it("gives a funder nothing to solve for across every released report, and the API serves what the PDF shows", async () => {
    const periods = familyPeriods(planted.db);
    expect(periods).toEqual(expect.arrayContaining(["2026-Q1", "2026-Q4", "2025", "2026"]));
    const released = await releasedToFunder(planted.coordinator, planted.funder, periods);
    // the PDF is drawn from exactly the data the API answers: the same bytes again from the funder's data
    for (const { data, pdf, version, createdAt } of released.filter((r) => r.data.period === "2026" || r.data.period === "2026-Q3")) {
      expect((await renderReportPdf(data, { version, createdAt: new Date(createdAt) })).equals(pdf)).toBe(true);
    }
    const shown = released.flatMap(({ data }) => figuresOf(data, truth));
    expect(shown.length).toBeGreaterThan(200);
    expect(attack(truth, shown)).toEqual([]);
    const year = released.find((r) => r.data.period === "2026")!.data;
    const q4 = released.find((r) => r.data.period === "2026-Q4")!.data;
    const child = (data: ReportData) => data.reach.byCourse.find((c) => c.key === "child")!.classes;
    expect(child(q4)).toMatchObject({ value: null, hidden: "small", text: "fewer than 5" });
    expect(child(year)).toMatchObject({ value: null, hidden: "protects-other", text: "not shown" });
    // the year's total stays shown: hiding never spreads from a pool to the totals around it
    expect(year.reach.classes.value).toBe(cellsOf(truth, "classes", year.quarters).reduce((total, key) => total + truth.get(key)!, 0));
  });

  it("answers the coordinator's preview with the same decisions as the stored version", async () => {
    for (const period of ["2026-Q3", "2026"]) {
      const preview = (await planted.coordinator.get(`/api/reports/${period}/preview`).expect(200)).body.report as ReportData;
      const built = buildReportData(planted.db, period, { now: new Date(preview.generatedAt) });
      expect(preview).toEqual(JSON.parse(JSON.stringify(built)));
    }
  });
});

describe("a quarter that arrives after reports were released", () => {
  it("leaves every version released before it consistent with those after it: nothing to solve for", async () => {
    const planted = await plantNetwork();
    try {
      planted.addClasses("2027-Q1", "2027-02-09", "adult", 8);
      planted.addClasses("2027-Q1", "2027-02-10", "child", 6);
      const before = truthOf(planted.db);
      const early = await releasedToFunder(planted.coordinator, planted.funder, ["2027-Q1", "2027"]);
      // a thin quarter: 3 classes. Pooling it with 2027-Q1 would now hide that quarter's 14, already released
      planted.addClasses("2027-Q2", "2027-05-11", "adult", 3);
      const after = truthOf(planted.db);
      const late = await releasedToFunder(planted.coordinator, planted.funder, ["2027-Q1", "2027-Q2", "2027"]);
      const year = (released: typeof early) => released.find((r) => r.data.period === "2027")!.data.reach.classes;
      expect(year(early).value).toBe(14);
      expect(year(late)).toMatchObject({ value: null, hidden: "protects-other" });
      expect(late.find((r) => r.data.period === "2027-Q1")!.data.reach.classes.value).toBe(14);
      // each version's counts as the cells they summed when it was made; 2027-Q1's cells did not change since
      const shown = [...early.flatMap(({ data }) => figuresOf(data, before)), ...late.flatMap(({ data }) => figuresOf(data, after))];
      expect(attack(after, shown)).toEqual([]);
    } finally {
      planted.db.$client.close();
    }
  }, 60_000);
});

// ------------------------------------------------------------------------------------------------------
// The demo network

describe("the demo network", () => {
  let db: Db;
  let coordinator: Agent;
  let funder: Agent;
  beforeAll(async () => {
    db = openDatabase(tempDbFile("qb-report-disclosure"));
    await seedDemo(db, { today: "2026-12-01" });
    const accounts = buildDirectory(DEMO_SCENARIO).accounts;
    const app = makeTestApp(db);
    const account = (role: string) => accounts.find((a) => a.role === role)!;
    coordinator = await signIn(app, account("coordinator").email, account("coordinator").password);
    funder = await signIn(app, account("funder").email, account("funder").password);
  }, 180_000);
  afterAll(() => db.$client.close());

  it("gives a funder holding every quarter's and year's report nothing to solve for", async () => {
    const periods = familyPeriods(db);
    expect(periods.length).toBeGreaterThanOrEqual(10);
    const truth = truthOf(db);
    const released = await releasedToFunder(coordinator, funder, periods);
    const shown = released.flatMap(({ data }) => figuresOf(data, truth));
    expect(shown.length).toBeGreaterThan(500);
    expect(attack(truth, shown)).toEqual([]);
    // the cells subtraction used to reveal stay hidden: 2026-Q4's 4 child classes, and the year's child classes with them
    const byPeriod = new Map(released.map(({ data }) => [data.period, data]));
    const childClasses = (period: string) => byPeriod.get(period)!.reach.byCourse.find((c) => c.key === "child")!.classes;
    expect(childClasses("2026-Q4").value).toBeNull();
    expect(childClasses("2026").value).toBeNull();
  }, 600_000);
});
