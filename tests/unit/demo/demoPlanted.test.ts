// The demo network plants stories for the retention, manikin and calibration figures: learners who come back
// for recertification and pass their first attempt less often after longer gaps, one adult manikin whose
// depth sensor reads 4 mm deep from the autumn of 2025, and one lenient instructor; and the quality lead's
// two improvement actions with the alert digest the imports would have mailed. The services that answer the
// pages and the CLI must find each of them in the seeded database.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../../server/db/client";
import { DEMO_SCENARIO } from "../../../server/demo/scenario";
import { digestText } from "../../../server/alerts/importAlerts";
import { allAlerts, myAlerts } from "../../../server/alerts/history";
import { findUserByEmail } from "../../../server/users/service";
import { currentSignals } from "../../../server/alerts/signals";
import { evaluateAction } from "../../../server/actions/evaluation";
import { allActions } from "../../../server/actions/service";
import { listOutbox } from "../../../server/mail/outbox";
import { calibrationByInstructor } from "../../../server/metrics/calibration";
import { monthlyRunChart } from "../../../server/metrics/monthlyRunChart";
import { quarterOf } from "../../../shared/period";
import { manikinDriftReport } from "../../../server/metrics/manikinDrift";
import { retention } from "../../../server/metrics/retention";
import { seedDemo } from "../../../server/seed/seedDemo";
import { makeTestDb } from "../../helpers/testApp";

let db: Db;
beforeAll(async () => {
  db = makeTestDb();
  await seedDemo(db, { today: "2026-12-01" });
}, 180_000);
afterAll(() => db.$client.close());

describe("demo story: returning learners", () => {
  it("has returns after 6 to 24 months, with fewer first-attempt passes after longer gaps", () => {
    const answer = retention(db, "2025-Q1", "2026-Q4");
    const bin = (months: string) => answer.returning.find((r) => r.months === months)!;
    expect(bin("0-6").learners).toBe(0);
    expect(bin("6-12").learners).toBeGreaterThan(150);
    expect(bin("12-18").learners).toBeGreaterThan(40);
    expect(bin("6-12").rate!).toBeGreaterThan(bin("12-18").rate!);
    expect(bin("12-18").rate!).toBeGreaterThan(bin("18-24").rate!);
    expect(answer.first_time.learners).toBeGreaterThan(1500);
  });
});

describe("demo story: the drifting manikin", () => {
  it("flags only the drifting manikin in 2026, about 4 mm deep", () => {
    const rows = manikinDriftReport(db, { from: "2026-Q1", to: "2026-Q4", siteId: null });
    const flagged = rows.filter((r) => r.flag === "check");
    expect(flagged.map((r) => r.manikin)).toEqual([DEMO_SCENARIO.driftingSensor.manikin]);
    expect(flagged[0].offset_mm!).toBeGreaterThan(3);
    expect(flagged[0].offset_mm!).toBeLessThan(5);
    expect(flagged[0].ci95![0]).toBeGreaterThan(0);
  });

  it("shows the step in the paired differences: near 0 before the drift, about +4 mm after", () => {
    const [row] = manikinDriftReport(db, { from: "2025-Q1", to: "2026-Q4", siteId: null }).filter((r) => r.manikin === DEMO_SCENARIO.driftingSensor.manikin);
    const meanOf = (list: number[]) => list.reduce((s, v) => s + v, 0) / list.length;
    const before = row.differences.filter((d) => d.date < DEMO_SCENARIO.driftingSensor.from).map((d) => d.difference_mm);
    const after = row.differences.filter((d) => d.date >= DEMO_SCENARIO.driftingSensor.from).map((d) => d.difference_mm);
    expect(before.length).toBeGreaterThan(5);
    expect(Math.abs(meanOf(before))).toBeLessThan(1.5);
    expect(meanOf(after)).toBeGreaterThan(3);
  });
});

describe("demo story: the drifting manikin in the import alerts", () => {
  it("is a signal over the newest four quarters, named with its offset in the digest", () => {
    const signals = currentSignals(db, "2026-12-01");
    expect(signals.drift.map((s) => s.key)).toEqual([`drift:${DEMO_SCENARIO.driftingSensor.manikin}:deeper`]);
    expect(signals.drift[0]).toMatchObject({ from: "2026-Q1", to: "2026-Q4", siteCode: "LTQ" });
    const text = digestText(signals);
    expect(text).toMatch(/Manikins whose depth readings differ from their peers' in the same classes, 2026 Q1 to 2026 Q4:/);
    expect(text).toMatch(new RegExp(`${DEMO_SCENARIO.driftingSensor.manikin} \\(LTQ\\): reads \\+[34]\\.\\d mm against its peers over \\d+ shared classes`));
  });
});

describe("demo story: the lenient instructor", () => {
  it("passes far more measured failures than any other instructor, every quarter of 2026", () => {
    for (const quarter of ["2026-Q1", "2026-Q2", "2026-Q3", "2026-Q4"]) {
      const rows = calibrationByInstructor(db, quarter);
      const lenient = rows.find((r) => r.instructor === DEMO_SCENARIO.lenientInstructor.code)!;
      const others = rows.filter((r) => r.instructor !== lenient.instructor);
      expect(lenient.lenient_share!, quarter).toBeGreaterThan(0.8);
      for (const other of others) expect(other.lenient_share ?? 0, `${other.instructor} in ${quarter}`).toBeLessThan(lenient.lenient_share!);
    }
  });
});

describe("demo story: improvement actions and the alert digest", () => {
  it("records the refresher, whose pass rate rose after it, and the depth cards, which moved nothing", () => {
    const actions = allActions(db);
    expect(actions).toHaveLength(2);
    const refresher = actions.find((a) => a.aim === "passRate")!;
    expect(refresher).toMatchObject({ siteId: null, instructorId: null, profile: null, owner: "Imogen Tarrow" });
    expect(quarterOf(refresher.startDate)).toBe(DEMO_SCENARIO.refresher.quarter);
    expect(evaluateAction(db, refresher).verdict).toBe("up");
    const monthly = monthlyRunChart(db, { from: "2025-Q1", to: "2026-Q4", siteId: null, instructorId: null, profile: null }, { splitAt: refresher.startDate });
    const [before, after] = monthly.phases;
    expect(after.median! - before.median!).toBeGreaterThan(0.1);
    expect(monthly.signal).toBe(true);

    const cards = actions.find((a) => a.aim === "too_shallow")!;
    expect(cards).toMatchObject({ siteCode: "WRM", profile: "adult", status: "stopped" });
    expect(evaluateAction(db, cards).verdict).toBe("no clear change");
  });

  it("keeps the digest about the instructor below the funnel limits in the outbox, for the coordinator and the quality lead", () => {
    const digests = listOutbox(db).filter((m) => m.subject.includes("after the latest import"));
    expect(digests.flatMap((m) => m.recipients).sort()).toEqual(["imogen.tarrow@harrowmere-cpr.example", "rowan.ellery@harrowmere-cpr.example"]);
    for (const message of digests) {
      expect(message.text).toContain("outside the 99.8 % funnel limits");
      expect(message.text).toMatch(/- IN06: below the limits \(\d+ of \d+ attempts passed\)/);
      expect(message.text).not.toContain("Desmond Quarrie");
      // the refresher's rise is a run above the network's median reaching the newest month
      expect(message.text).toMatch(/- The network: above its median in \d+ months from/);
    }
    // the instructor account's defaults (service and drift of its own site's manikins) hold nothing here:
    // no empty message, and nothing about IN06
    expect(listOutbox(db).filter((m) => m.recipients.includes("ilse.pendrake@harrowmere-cpr.example"))).toEqual([]);
  });

  it("lists what the coordinator was mailed on the Alerts page, with the page behind each signal", () => {
    const coordinator = findUserByEmail(db, "rowan.ellery@harrowmere-cpr.example")!;
    const { deliveries } = myAlerts(db, coordinator.id);
    expect(deliveries.map((d) => d.kind).sort()).toEqual(["drift", "funnel", "service", "shift"]);
    expect(deliveries.find((d) => d.kind === "drift")!.link).toEqual({
      label: `Manikin ${DEMO_SCENARIO.driftingSensor.manikin}`,
      path: `/equipment/manikins/${DEMO_SCENARIO.driftingSensor.manikin}`,
    });
    expect(allAlerts(db).signals.every((s) => s.recipients === 2)).toBe(true);
  });
});
