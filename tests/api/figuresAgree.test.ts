// One question, one answer: for every quarter of the demo network, the overview page's API, the funder
// report's preview and `quarterbeat stats --json` must give the same figures — counts, pass rate, recorded
// completion, errors, the feedback groups and instructors' agreement. A figure defined twice would drift
// apart here first.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { OverviewAnswer } from "../../shared/schemas/insight";
import type { ReportData } from "../../shared/schemas/report";
import { attemptErrorNames } from "../../shared/scoring/scoreAttempt";
import { openDatabase, type Db } from "../../server/db/client";
import { buildDirectory } from "../../server/demo/directory";
import { DEMO_SCENARIO } from "../../server/demo/scenario";
import { seedDemo } from "../../server/seed/seedDemo";
import type { QuarterSummary } from "../../server/stats/quarterSummary";
import { runCli } from "../faults/helpers";
import { makeTestApp, signIn, tempDbFile, type Agent } from "../helpers/testApp";

let db: Db;
let dbFile: string;
let coordinator: Agent;
let quarters: string[];

beforeAll(async () => {
  dbFile = tempDbFile("qb-figures-agree");
  db = openDatabase(dbFile);
  await seedDemo(db, { today: "2026-12-01" });
  const account = buildDirectory(DEMO_SCENARIO).accounts.find((a) => a.role === "coordinator")!;
  coordinator = await signIn(makeTestApp(db), account.email, account.password);
  quarters = (await coordinator.get("/api/insight/options")).body.quarters;
}, 180_000);
afterAll(() => db.$client.close());

interface ThreeAnswers {
  overview: OverviewAnswer;
  report: ReportData;
  cli: QuarterSummary;
}

async function answersFor(quarter: string): Promise<ThreeAnswers> {
  const overview = await coordinator.get(`/api/insight/overview?quarter=${quarter}`);
  expect(overview.status).toBe(200);
  const report = await coordinator.get(`/api/reports/${quarter}/preview`);
  expect(report.status).toBe(200);
  const cli = await runCli(dbFile, ["stats", "--quarter", quarter, "--json"]);
  expect(cli.code, cli.stderr).toBe(0);
  return { overview: overview.body, report: report.body.report, cli: JSON.parse(cli.stdout) };
}

describe("the pages, the report and the CLI agree", () => {
  it("the demo network has quarters to compare", () => {
    expect(quarters.length).toBeGreaterThanOrEqual(8);
  });

  it("on every quarter's figures", { timeout: 600_000 }, async () => {
    for (const quarter of quarters) {
      const { overview, report, cli } = await answersFor(quarter);
      const where = `in ${quarter}`;

      // reach, from the class logs and the attempts
      expect(overview.classes, where).toBe(cli.classes);
      expect(report.reach.classes.value, where).toBe(cli.classes);
      expect(overview.learners, where).toBe(cli.learners);
      expect(report.reach.learners.value, where).toBe(cli.learners);
      expect(overview.attempts, where).toBe(cli.attempts);
      expect(report.reach.attempts.value, where).toBe(cli.attempts);

      // the measured pass rate and its interval
      expect(overview.passRate.successes, where).toBe(cli.passed);
      expect(overview.passRate.n, where).toBe(cli.attempts);
      expect(overview.passRate.rate, where).toBeCloseTo(cli.pass_rate!, 12);
      expect(report.passRate.value, where).toBeCloseTo(cli.pass_rate!, 12);
      expect(report.passRate.n.value, where).toBe(cli.attempts);
      expect(overview.passRate.low, where).toBeCloseTo(cli.pass_rate_ci95![0], 12);
      expect(overview.passRate.high, where).toBeCloseTo(cli.pass_rate_ci95![1], 12);
      expect(report.passRate.low, where).toBeCloseTo(cli.pass_rate_ci95![0], 12);
      expect(report.passRate.high, where).toBeCloseTo(cli.pass_rate_ci95![1], 12);

      // what instructors recorded, and how often they agree with the measurement
      expect(overview.recordedCompletion.rate, where).toBeCloseTo(cli.course_pass_rate!, 12);
      expect(report.agreement.completionRate.value, where).toBeCloseTo(cli.course_pass_rate!, 12);
      expect(overview.agreement.pairs, where).toBe(cli.agreement.attempts);
      expect(report.agreement.pairs.value, where).toBe(cli.agreement.attempts);
      expect(overview.agreement.kappa, where).toBeCloseTo(cli.agreement.kappa!, 12);
      expect(report.agreement.kappa, where).toBeCloseTo(cli.agreement.kappa!, 12);
      expect(overview.medianScore, where).toBeCloseTo(cli.median.score!, 12);

      // per learner: measured, first attempt, at least once
      expect(overview.learnerOutcomes.measured, where).toBe(cli.learners_measured);
      expect(overview.learnerOutcomes.firstAttempt.rate, where).toBeCloseTo(cli.first_attempt_pass_rate!, 12);
      expect(overview.learnerOutcomes.everPassed.rate, where).toBeCloseTo(cli.ever_passed_rate!, 12);

      // errors: the same count of attempts with each error everywhere; the funder report may hide a small cell
      // (and one beside it, so the hidden one cannot be worked out from the total), but never changes one
      for (const error of attemptErrorNames) {
        const onPage = overview.errors.rows.find((row) => row.error === error)?.count ?? 0;
        expect(onPage, `${error} ${where}`).toBe(cli.errors[error]);
        const inReport = report.errors.rows.find((row) => row.name === error)?.count;
        if (inReport?.value === null) expect(inReport.hidden, `${error} ${where}`).not.toBeNull();
        else expect(inReport?.value ?? 0, `${error} ${where}`).toBe(cli.errors[error]);
      }

      // consumables per 100 learners: the equipment page sums the same class logs as the report
      const equipment = await coordinator.get(`/api/equipment?quarter=${quarter}`);
      expect(equipment.status).toBe(200);
      const rows = equipment.body.consumables as { learners: number; mouthpieces: { total: number }; lungs: { total: number } }[];
      const learners = rows.reduce((sum, row) => sum + row.learners, 0);
      const mouthpieces = rows.reduce((sum, row) => sum + row.mouthpieces.total, 0);
      expect(learners, where).toBe(cli.learners);
      if (report.equipment.mouthpiecesPer100Learners.value !== null) {
        expect(report.equipment.mouthpiecesPer100Learners.value, where).toBeCloseTo((100 * mouthpieces) / learners, 9);
      }

      // live against hidden display
      for (const mode of ["live", "hidden"] as const) {
        const onPage = overview.feedback.find((group) => group.mode === mode)!;
        expect(onPage.attempts, `${mode} ${where}`).toBe(cli.by_feedback[mode].attempts);
        expect(report.feedback[mode].attempts.value, `${mode} ${where}`).toBe(cli.by_feedback[mode].attempts);
        if (cli.by_feedback[mode].pass_rate === null) continue;
        expect(onPage.passRate.rate, `${mode} ${where}`).toBeCloseTo(cli.by_feedback[mode].pass_rate!, 12);
        expect(report.feedback[mode].passRate.value, `${mode} ${where}`).toBeCloseTo(cli.by_feedback[mode].pass_rate!, 12);
      }
    }
  });
});
