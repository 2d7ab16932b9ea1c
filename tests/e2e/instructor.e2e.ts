// An instructor: signs in, reads their medians and percentile beside the network's on My standing (the same
// figures the API gives), opens their own attempts with their most common error, and cannot open another
// instructor's class or attempt by editing the address.
import type { AttemptListAnswer, StandingAnswer } from "../../shared/schemas/insight";
import { errorShortNames } from "../../shared/vocabulary";
import { formatMetric, metricWords, percentileSentence } from "../../src/features/insight/standing/StandingMetrics";
import { describeFindings } from "./support/a11y";
import { demoAccount } from "./support/accounts";
import { expect, test } from "./support/fixtures";
import { api, textOf } from "./support/pages";
import { SEED_QUARTER } from "./support/seed";

const instructor = demoAccount("instructor");

interface OtherClass {
  id: string;
  date: string;
  code: string;
  name: string;
}

test.describe("instructor", () => {
  test("finds their medians and percentile against the network, opens their attempts with their commonest error, and cannot open another instructor's class", async ({
    instructorPage: page,
    journey,
    database,
  }) => {
    // My standing is the instructor's start page, on the latest quarter
    await page.waitForURL((url) => url.pathname === "/my-standing" && url.searchParams.get("quarter") === SEED_QUARTER);
    const answer = await api<StandingAnswer>(page, `/api/insight/standing?quarter=${SEED_QUARTER}`);
    expect(answer.status).toBe(200);
    const standing = answer.body;
    expect(standing.me.code).toBe(instructor.instructor);
    expect(standing.metrics.length).toBeGreaterThan(0);

    const cards = page.getByRole("list", { name: "Your medians beside the network's" }).getByRole("listitem");
    await cards.first().waitFor();
    expect(await cards.count()).toBe(standing.metrics.length);
    const instructors = standing.spread.points.length;
    for (const [i, metric] of standing.metrics.entries()) {
      const card = cards.nth(i);
      const words = metricWords[metric.key];
      expect(await textOf(card.getByRole("heading"))).toBe(words.label);
      // a metric whose network median is 100 % shows the share of attempts at 100 % instead of medians
      if (metric.ceiling) {
        expect(await textOf(card)).toContain("of your attempts at 100 %");
        continue;
      }
      // mine, the network's median and my percentile among the instructors, as the API reports them
      expect(await textOf(card.locator("p").nth(1).locator("span").first())).toBe(formatMetric(metric.key, metric.mine));
      expect(await textOf(card.locator("p strong"))).toBe(formatMetric(metric.key, metric.network));
      expect(await textOf(card.locator("p").last())).toBe(
        percentileSentence(
          metric.percentileRank,
          instructors,
          metric.mine !== null && metric.network !== null ? metric.mine - metric.network : null,
          standing.funnel.adjust === "case-mix",
        ),
      );
    }
    // the heading names the instructor and the quarter
    await page.getByRole("heading", { name: new RegExp(`^${standing.me.code} · ${standing.me.name}, ${SEED_QUARTER.replace("-", " ")}$`) }).waitFor();
    await journey.visited(page, "my-standing");

    // my most common error, to my own attempts with it, and back
    const commonest = [...standing.errorProfile.rows].filter((r) => r.mine !== null && r.mine > 0).sort((a, b) => b.mine! - a.mine!)[0];
    expect(commonest).toBeDefined();
    await page
      .getByRole("navigation", { name: "Open your attempts with an error" })
      .getByRole("link", { name: errorShortNames[commonest.error], exact: true })
      .click();
    await page.waitForURL(
      (url) => url.pathname === "/attempts" && url.searchParams.get("error") === commonest.error && url.searchParams.get("quarter") === SEED_QUARTER,
    );
    const mine = await api<AttemptListAnswer>(page, `/api/attempts?quarter=${SEED_QUARTER}&error=${commonest.error}&pageSize=200`);
    expect(mine.status).toBe(200);
    expect(mine.body.total).toBeGreaterThan(0);
    expect(mine.body.attempts.every((a) => a.instructor?.code === standing.me.code && a.errors.includes(commonest.error))).toBe(true);
    await page.getByText(new RegExp(`^Attempts 1–\\d+ of ${mine.body.total.toLocaleString("en-GB")}, sorted by`)).waitFor();
    await journey.visited(page, "my-attempts-with-error");
    await page.goBack();
    await page.waitForURL((url) => url.pathname === "/my-standing");

    // another instructor's class in the same quarter, found in the database
    const other = database
      .prepare(
        `SELECT c.id, c.date, i.code, i.name FROM classes c JOIN instructors i ON i.id = c.instructor_id
         WHERE i.code <> ? AND c.quarter = ? AND EXISTS (SELECT 1 FROM attempts a WHERE a.class_id = c.id) ORDER BY c.id LIMIT 1`,
      )
      .get(instructor.instructor, SEED_QUARTER) as OtherClass;
    expect(other).toBeDefined();
    const theirAttempts = database.prepare("SELECT id, learner FROM attempts WHERE class_id = ? ORDER BY id").all(other.id) as {
      id: string;
      learner: string;
    }[];
    expect(theirAttempts.length).toBeGreaterThan(0);
    // (the instructor's own class table links none of them)
    expect(await page.locator(`a[href^="/classes/${encodeURIComponent(other.id)}"]`).count()).toBe(0);

    await page.goto(`/classes/${encodeURIComponent(other.id)}`);
    await page.getByRole("heading", { name: "Class not found or not yours", level: 1 }).waitFor();
    await page.getByText("No class has this id, or it was taught by another instructor.").waitFor();
    const shown = await textOf(page.locator("main"));
    for (const secret of [other.code, other.name, ...theirAttempts.map((a) => a.learner), ...theirAttempts.map((a) => a.id)]) {
      expect(shown, `the page shows ${secret}`).not.toContain(secret);
    }
    await journey.visited(page, "other-class-refused");
    // the API answers such a class as missing, and lists none of its attempts
    expect((await api(page, `/api/classes/${encodeURIComponent(other.id)}`)).status).toBe(404);
    const listed = await api<{ attempts?: unknown[] }>(page, `/api/attempts?class=${encodeURIComponent(other.id)}&quarter=${SEED_QUARTER}`);
    expect(listed.status === 404 || listed.body.attempts?.length === 0).toBe(true);

    // nor one of its attempts
    await page.goto(`/attempts/${encodeURIComponent(theirAttempts[0].id)}`);
    await page.getByRole("heading", { name: "Attempt not found", level: 1 }).waitFor();
    expect(await textOf(page.locator("main"))).not.toContain(theirAttempts[0].learner);
    expect((await api(page, `/api/attempts/${encodeURIComponent(theirAttempts[0].id)}`)).status).toBe(404);
    await journey.visited(page, "other-attempt-refused");

    expect(journey.findings, describeFindings(journey.findings)).toEqual([]);
  });
});
