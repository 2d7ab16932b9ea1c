// The attempt summaries (tallies and value distributions kept by triggers) against plain JavaScript over the
// attempts themselves, after inserts, deletes and updates of every kind the product makes (import, undo,
// rescore, a class moved to another quarter): every tally and every median must equal the recomputation.
// Medians are R's type 7 (Hyndman & Fan 1996), the definition of shared/stats `median`.
import { eq, inArray, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { attemptErrorNames } from "../../shared/scoring/scoreAttempt";
import { median, quantile } from "../../shared/stats";
import type { Db } from "../../server/db/client";
import { attempts } from "../../server/db/schema";
import { addPendingAttempts, deferSummaries } from "../../server/metrics/deferredSummaries";
import { refreshInstructorValues } from "../../server/metrics/instructorValues";
import { refreshRunningValues } from "../../server/metrics/runningValues";
import { learnerOutcomes } from "../../server/metrics/learnerOutcomes";
import {
  countsByQuarterAndInstructor,
  medianIn,
  mediansBy,
  mergeCounts,
  quantileOfCounts,
  quartersWithAttempts,
  instructorCellCounts,
  talliesBy,
  talliesByInstructorStratum,
  talliesByPair,
  totalTally,
  type Dimension,
  type SummaryMetric,
  type SummaryScope,
} from "../../server/metrics/summaries";
import { seedInsightNetwork } from "../fixtures/insight/network";
import { makeTestDb } from "../helpers/testApp";

type AttemptRow = typeof attempts.$inferSelect;

let db: Db;
const everything: SummaryScope = { from: "0000-Q1", to: "9999-Q4", siteId: null, profile: null, feedback: null, instructorId: null, manikinId: null };

beforeAll(async () => {
  db = makeTestDb();
  await seedInsightNetwork(db);
  // a few thousand more attempts with scattered, tied and repeated values, some without a manikin or a judgement
  const base = db.select().from(attempts).limit(1).get()!;
  let seed = 12345;
  const random = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
  db.$client.transaction(() => {
    for (let i = 0; i < 3000; i++) {
      const score = random() < 0.2 ? 70 : Math.round(random() * 10000) / 100;
      db.insert(attempts)
        .values({
          ...base,
          id: `EXTRA-${i}`,
          score,
          depthOkPct: Math.round(random() * 100),
          passed: random() < 0.4,
          errorMask: Math.floor(random() * 128),
          instructorResult: random() < 0.15 ? null : random() < 0.5 ? "pass" : "fail",
          manikinId: i % 7 === 0 ? null : base.manikinId,
          instructorId: 1 + (i % 4),
          feedback: i % 3 === 0 ? "live" : "hidden",
          profile: i % 5 === 0 ? "infant" : base.profile,
          quarter: i % 2 ? "2026-Q2" : "2026-Q1",
        })
        .run();
    }
  })();
  db.$client.transaction(() => {
    // an undo: a block of attempts deleted
    db.delete(attempts)
      .where(
        inArray(
          attempts.id,
          Array.from({ length: 400 }, (_, i) => `EXTRA-${i}`),
        ),
      )
      .run();
    // a rescore: new scores and results for some attempts, unchanged values for others
    db.update(attempts)
      .set({ score: sql`round(${attempts.score} * 0.9, 2)`, passed: sql`NOT ${attempts.passed}`, policyVersion: 1 })
      .where(sql`${attempts.id} LIKE 'EXTRA-1%'`)
      .run();
    db.update(attempts)
      .set({ score: sql`${attempts.score}` })
      .where(sql`${attempts.id} LIKE 'EXTRA-2%'`)
      .run();
    // a class moved to another quarter, and a judgement corrected
    db.update(attempts)
      .set({ quarter: "2025-Q4" })
      .where(sql`${attempts.id} LIKE 'EXTRA-9%'`)
      .run();
    db.update(attempts)
      .set({ instructorResult: "pass" })
      .where(sql`${attempts.id} LIKE 'EXTRA-8%'`)
      .run();
    // learners who return: the same code on attempts of other groups, some started earlier
    db.update(attempts)
      .set({ learner: sql`'RETURNING-' || (cast(substr(${attempts.id}, 7) AS integer) % 40)` })
      .where(sql`${attempts.id} LIKE 'EXTRA-5%'`)
      .run();
    db.update(attempts)
      .set({ startedAt: sql`substr(${attempts.startedAt}, 1, 10) || 'T06:00:00Z'` })
      .where(sql`${attempts.id} LIKE 'EXTRA-55%'`)
      .run();
  })();
  // a bulk import: triggers deferred, rows added set-wise before the commit — including rows changed or deleted
  // while still pending, and a change to an attempt summarised earlier in the same transaction
  db.$client.transaction(() => {
    deferSummaries(db.$client);
    for (let i = 0; i < 600; i++) {
      db.insert(attempts)
        .values({
          ...base,
          id: `BULK-${i}`,
          learner: i % 3 === 0 ? `RETURNING-${i % 40}` : `BULK-L${i}`,
          score: Math.round(random() * 1000) / 10,
          passed: random() < 0.5,
          errorMask: Math.floor(random() * 128),
          instructorResult: random() < 0.2 ? null : "fail",
          manikinId: i % 5 === 0 ? null : base.manikinId,
          instructorId: 1 + (i % 3),
          feedback: i % 2 === 0 ? "live" : "hidden",
          quarter: i % 4 === 0 ? "2026-Q1" : "2026-Q2",
          startedAt: `2026-0${1 + (i % 6)}-1${i % 10}T09:00:00Z`,
        })
        .run();
    }
    db.update(attempts)
      .set({ score: 12.5, passed: true })
      .where(sql`${attempts.id} LIKE 'BULK-1%'`)
      .run();
    db.delete(attempts)
      .where(sql`${attempts.id} LIKE 'BULK-2%'`)
      .run();
    db.update(attempts)
      .set({ passed: sql`NOT ${attempts.passed}` })
      .where(sql`${attempts.id} LIKE 'EXTRA-7%'`)
      .run();
    addPendingAttempts(db.$client);
  })();
  // hand edits after the import, outside every service: the triggers note their instructor-quarters
  db.update(attempts)
    .set({ depthOkPct: sql`100 - ${attempts.depthOkPct}`, score: sql`${attempts.score} / 2` })
    .where(sql`${attempts.id} LIKE 'EXTRA-3%'`)
    .run();
  db.delete(attempts)
    .where(sql`${attempts.id} LIKE 'BULK-4%'`)
    .run();
});
afterAll(() => db.$client.close());

function rowsIn(scope: SummaryScope): AttemptRow[] {
  return db
    .select()
    .from(attempts)
    .all()
    .filter(
      (row) =>
        row.quarter >= scope.from &&
        row.quarter <= scope.to &&
        (scope.siteId === null || row.siteId === scope.siteId) &&
        (scope.profile === null || row.profile === scope.profile) &&
        (scope.feedback === null || row.feedback === scope.feedback) &&
        (scope.instructorId === null || row.instructorId === scope.instructorId) &&
        (scope.manikinId === null || row.manikinId === scope.manikinId),
    );
}

/** A tally in plain JavaScript. */
function tallyOf(rows: AttemptRow[]) {
  const judged = (result: "pass" | "fail", passed: boolean) => rows.filter((r) => r.instructorResult === result && r.passed === passed).length;
  return {
    n: rows.length,
    passed: rows.filter((r) => r.passed).length,
    pp: judged("pass", true),
    pf: judged("pass", false),
    fp: judged("fail", true),
    ff: judged("fail", false),
    withErrors: rows.filter((r) => r.errorMask !== 0).length,
    compressions: rows.reduce((sum, r) => sum + r.compressions, 0),
    errors: Object.fromEntries(attemptErrorNames.map((name, bit) => [name, rows.filter((r) => (r.errorMask & (1 << bit)) !== 0).length])),
  };
}

const columnOf: Record<Exclude<Dimension, "policyVersion">, keyof AttemptRow> = {
  quarter: "quarter",
  siteId: "siteId",
  instructorId: "instructorId",
  manikinId: "manikinId",
  profile: "profile",
  feedback: "feedback",
};
const metricColumn: Record<SummaryMetric, keyof AttemptRow> = {
  score: "score",
  depth_ok_pct: "depthOkPct",
  rate_ok_pct: "rateOkPct",
  recoil_ok_pct: "recoilOkPct",
  hands_on_pct: "handsOnPct",
};

function groupsOf(rows: AttemptRow[], dimension: Exclude<Dimension, "policyVersion">): Map<string | number, AttemptRow[]> {
  const groups = new Map<string | number, AttemptRow[]>();
  for (const row of rows) {
    // attempts without a manikin are kept under 0
    const key = (row[columnOf[dimension]] ?? 0) as string | number;
    groups.set(key, [...(groups.get(key) ?? []), row]);
  }
  return groups;
}

const scopes: [string, SummaryScope][] = [
  ["everything", everything],
  ["one quarter", { ...everything, from: "2026-Q2", to: "2026-Q2" }],
  ["a network range after an earlier quarter", { ...everything, from: "2026-Q1", to: "2026-Q2" }],
  ["a range with live display", { ...everything, from: "2025-Q4", to: "2026-Q2", feedback: "live" }],
  ["a range ending before the latest quarter", { ...everything, from: "2025-Q4", to: "2026-Q1" }],
  ["one instructor over the two latest quarters", { ...everything, from: "2026-Q1", to: "2026-Q2", instructorId: 2 }],
  ["infant attempts", { ...everything, profile: "infant" }],
  ["one site", { ...everything, siteId: 1 }],
  ["one instructor", { ...everything, instructorId: 3 }],
  ["one manikin", { ...everything, manikinId: 1 }],
];

describe("attempt summaries equal the attempts they summarise", () => {
  const talliesEqualTheAttempts = (scope: SummaryScope) => {
    const rows = rowsIn(scope);
    expect(rows.length).toBeGreaterThan(0);
    expect(totalTally(db, scope)).toEqual(tallyOf(rows));
    for (const dimension of Object.keys(columnOf) as (keyof typeof columnOf)[]) {
      const expected = new Map([...groupsOf(rows, dimension)].map(([key, members]) => [key, tallyOf(members)]));
      expect(talliesBy(db, scope, dimension)).toEqual(expected);
    }
    // by instructor and patient type together, as the case-mix adjustment reads them
    const byPair = new Map<string, AttemptRow[]>();
    for (const row of rows) byPair.set(`${row.instructorId}|${row.profile}`, [...(byPair.get(`${row.instructorId}|${row.profile}`) ?? []), row]);
    expect(talliesByPair(db, scope, "instructorId", "profile")).toEqual(new Map([...byPair].map(([key, members]) => [key, tallyOf(members)])));
    // by instructor and stratum (patient type × display), as standing and the funnel read them
    const byStratum = new Map<number, Map<string, AttemptRow[]>>();
    for (const row of rows) {
      const strata = byStratum.get(row.instructorId) ?? new Map<string, AttemptRow[]>();
      strata.set(`${row.profile}|${row.feedback}`, [...(strata.get(`${row.profile}|${row.feedback}`) ?? []), row]);
      byStratum.set(row.instructorId, strata);
    }
    expect(talliesByInstructorStratum(db, scope)).toEqual(
      new Map([...byStratum].map(([id, strata]) => [id, new Map([...strata].map(([key, members]) => [key, tallyOf(members)]))])),
    );
  };

  it.each(scopes)("tallies in total and by every dimension, with changed instructor-quarters noted (%s)", (_name, scope) => {
    talliesEqualTheAttempts(scope);
  });

  // the release grid's cells, per instructor: quarter × site × patient type × feedback display × manikin (0 for none)
  const cellsEqualTheAttempts = () => {
    for (const quarter of quartersWithAttempts(db)) {
      const expected = new Map<string, { n: number; judged: number }>();
      for (const row of rowsIn({ ...everything, from: quarter, to: quarter })) {
        const key = [row.quarter, row.siteId, row.profile, row.feedback, row.manikinId ?? 0, row.instructorId].join("|");
        const cell = expected.get(key) ?? { n: 0, judged: 0 };
        cell.n += 1;
        if (row.instructorResult !== null) cell.judged += 1;
        expected.set(key, cell);
      }
      const counted = new Map(
        instructorCellCounts(db, quarter).map((c) => [
          [c.quarter, c.siteId, c.profile, c.feedback, c.manikinId, c.instructorId].join("|"),
          { n: c.n, judged: c.judged },
        ]),
      );
      expect(counted).toEqual(expected);
    }
    // each instructor's attempts and judged attempts per quarter, as whole-quarter releases read them
    for (const measure of ["attempts", "judged"] as const) {
      const expected = new Map<string, number>();
      for (const row of rowsIn(everything)) {
        if (measure === "judged" && row.instructorResult === null) continue;
        const key = `${row.quarter}|${row.instructorId}`;
        expected.set(key, (expected.get(key) ?? 0) + 1);
      }
      const counted = countsByQuarterAndInstructor(db, everything.from, everything.to, measure);
      expect(new Map(counted.map(({ quarter, instructorId, count }) => [`${quarter}|${instructorId}`, count]))).toEqual(expected);
    }
  };

  it("release-grid cells of every quarter, with changed instructor-quarters noted", () => {
    expect(db.$client.prepare("SELECT count(*) FROM instructor_values_stale").pluck().get()).toBeGreaterThan(0);
    cellsEqualTheAttempts();
  });

  const mediansEqualTheAttempts = (scope: SummaryScope) => {
    const rows = rowsIn(scope);
    for (const metric of Object.keys(metricColumn) as SummaryMetric[]) {
      const values = (members: AttemptRow[]) => members.map((row) => row[metricColumn[metric]] as number);
      expect(medianIn(db, metric, scope)).toBe(median(values(rows)));
      for (const dimension of ["quarter", "instructorId", "feedback", "profile"] as const) {
        const expected = new Map([...groupsOf(rows, dimension)].map(([key, members]) => [key, median(values(members))]));
        expect(mediansBy(db, metric, scope, dimension)).toEqual(expected);
      }
    }
  };

  // the writes above went straight to the table, as a hand edit would: their instructor-quarters are still
  // noted, so the readers take those from the attempts
  it.each(scopes)("medians of every metric, in total and by each dimension, with changed instructor-quarters noted (%s)", (_name, scope) => {
    expect(db.$client.prepare("SELECT count(*) FROM instructor_values_stale").pluck().get()).toBeGreaterThan(0);
    mediansEqualTheAttempts(scope);
  });

  it("medians, tallies and grid cells from the packed rows alone, once the noted instructor-quarters are rebuilt", () => {
    expect(refreshInstructorValues(db.$client)).toBeGreaterThan(0);
    expect(db.$client.prepare("SELECT count(*) FROM instructor_values_stale").pluck().get()).toBe(0);
    for (const [, scope] of scopes) {
      mediansEqualTheAttempts(scope);
      talliesEqualTheAttempts(scope);
    }
    cellsEqualTheAttempts();
  });

  it("keeps each instructor's running totals, step by step, equal to totals built afresh from every quarter", () => {
    const runningRows = () => db.$client.prepare("SELECT * FROM instructor_running_values ORDER BY instructor_id, quarter").raw(true).all();
    const kept = runningRows();
    expect(kept.length).toBe(db.$client.prepare("SELECT count(*) FROM instructor_values").pluck().get());
    db.$client.transaction(() => refreshRunningValues(db.$client, "all"))();
    expect(runningRows()).toEqual(kept);
  });

  it.each(scopes)("learner outcomes: learners, first attempt passed, passed at least once (%s)", (_name, scope) => {
    const byLearner = new Map<string, AttemptRow[]>();
    for (const row of rowsIn(scope)) byLearner.set(row.learner, [...(byLearner.get(row.learner) ?? []), row]);
    // earliest quarter, then start time, then id
    const order = (row: AttemptRow) => [row.quarter, row.startedAt, row.id].join("\u0001");
    const earliest = (rows: AttemptRow[]) => [...rows].sort((a, b) => (order(a) < order(b) ? -1 : 1))[0];
    expect(learnerOutcomes(db, scope)).toEqual({
      learners: byLearner.size,
      firstPassed: [...byLearner.values()].filter((rows) => earliest(rows).passed).length,
      everPassed: [...byLearner.values()].filter((rows) => rows.some((row) => row.passed)).length,
    });
  });

  it("lists the quarters that hold attempts, and drops a quarter when its last attempt goes", () => {
    expect(quartersWithAttempts(db)).toContain("2025-Q4");
    db.delete(attempts).where(eq(attempts.quarter, "2025-Q4")).run();
    expect(quartersWithAttempts(db)).not.toContain("2025-Q4");
    expect(totalTally(db, { ...everything, from: "2025-Q4", to: "2025-Q4" }).n).toBe(0);
    refreshInstructorValues(db.$client);
    const left = db.$client.prepare("SELECT count(*) FROM instructor_values WHERE quarter = '2025-Q4'").pluck().get();
    expect(left).toBe(0);
  });
});

describe("deferred summaries in a bulk import", () => {
  it("leave no trace when the import rolls back, and switch the per-row triggers back on", () => {
    const before = totalTally(db, everything);
    expect(() =>
      db.$client.transaction(() => {
        deferSummaries(db.$client);
        db.insert(attempts)
          .values({ ...db.select().from(attempts).limit(1).get()!, id: "ROLLED-BACK" })
          .run();
        throw new Error("refused file");
      })(),
    ).toThrow("refused file");
    expect(db.$client.prepare("SELECT count(*) FROM summary_pending").pluck().get()).toBe(0);
    expect(db.$client.prepare("SELECT count(*) FROM summary_deferral").pluck().get()).toBe(0);
    expect(totalTally(db, everything)).toEqual(before);
    // outside an import, a new attempt is summarised at once
    db.insert(attempts)
      .values({ ...db.select().from(attempts).limit(1).get()!, id: "ONE-MORE" })
      .run();
    expect(totalTally(db, everything).n).toBe(before.n + 1);
    db.delete(attempts).where(eq(attempts.id, "ONE-MORE")).run();
    expect(totalTally(db, everything)).toEqual(before);
  });
});

describe("quantiles of a distribution kept as value counts", () => {
  it("matches the worked example of Hyndman & Fan type 7: 1..10 → median 5.5", () => {
    // R: median(1:10) = 5.5; quantile(1:10, 0.25, type = 7) = 3.25
    const counts = Array.from({ length: 10 }, (_, i) => ({ value: i + 1, count: 1 }));
    expect(quantileOfCounts(counts, 0.5)).toBe(5.5);
    expect(quantileOfCounts(counts, 0.25)).toBe(3.25);
  });

  it("equals shared/stats quantile on the expanded values, with ties", () => {
    const counts = [
      { value: 12.5, count: 3 },
      { value: 40, count: 1 },
      { value: 70, count: 6 },
      { value: 99.9, count: 2 },
    ];
    const expanded = counts.flatMap(({ value, count }) => Array<number>(count).fill(value));
    for (const p of [0, 0.1, 0.25, 0.5, 0.75, 0.9, 1]) expect(quantileOfCounts(counts, p)).toBe(quantile(expanded, p));
    expect(quantileOfCounts([], 0.5)).toBeNull();
  });

  it("merges distributions into the distribution of both", () => {
    expect(
      mergeCounts(
        [
          { value: 1, count: 2 },
          { value: 3, count: 1 },
        ],
        [
          { value: 2, count: 1 },
          { value: 3, count: 4 },
        ],
      ),
    ).toEqual([
      { value: 1, count: 2 },
      { value: 2, count: 1 },
      { value: 3, count: 5 },
    ]);
  });
});
