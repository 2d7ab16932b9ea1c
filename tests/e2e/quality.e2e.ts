// The quality lead: from the error Pareto on Error trends to one error's breakdown, on to the attempts of a
// group, to one attempt with a compression stream: its pass-rule checklist and its compression charts; and from
// the Equipment page to the manikin flagged for a depth sensor check, with its evidence. What the screens show is
// checked against the API's answers.
import type { Locator, Page } from "@playwright/test";
import type { DriftAnswer, ManikinRecord } from "../../shared/schemas/equipment";
import type { AttemptDetailAnswer, TechniqueErrorsAnswer } from "../../shared/schemas/insight";
import { DEMO_SCENARIO } from "../../server/demo/scenario";
import { fromMm, type LengthUnit } from "../../shared/units";
import { besideThreshold } from "../../src/features/attempts/labels";
import { describeFindings } from "./support/a11y";
import { expect, test } from "./support/fixtures";
import { api, textOf } from "./support/pages";
import { SEED_QUARTER } from "./support/seed";

/** A figure of the UI kit's Chart, by its title. */
function chart(page: Page, title: string): Locator {
  return page.locator("figure").filter({ has: page.getByRole("heading", { name: title, exact: true }) });
}

/** The drawn chart inside a Chart figure: Plot's svg in the labelled role="img" frame. */
function picture(figure: Locator): Locator {
  return figure.locator('div[role="img"] svg').first();
}

test.describe("quality lead", () => {
  test("goes from the error Pareto to an attempt with a compression stream in three clicks, and back to the same list", async ({
    qualityLeadPage: page,
    journey,
  }) => {
    await page.waitForURL((url) => url.pathname === "/overview");

    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Error trends" }).click();
    await page.waitForURL((url) => url.pathname === "/errors");
    const pareto = chart(page, "Errors, most frequent first");
    await picture(pareto).waitFor();
    const errors = await api<TechniqueErrorsAnswer>(page, `/api/insight/errors?quarter=${SEED_QUARTER}`);
    expect(errors.status).toBe(200);
    const top = errors.body.pareto.rows[0];
    expect(top.count).toBeGreaterThan(0);
    await journey.visited(page, "error-trends");

    // the Pareto's table view: the most frequent error first, with the API's count
    await pareto.getByRole("button", { name: "Show as table" }).click();
    const firstRow = pareto.locator("tbody tr").first();
    expect(await textOf(firstRow.locator("th, td").first())).toBe(top.label);
    expect(await textOf(firstRow)).toContain(String(top.count));
    await journey.shot(page, "pareto-table");

    // one error's trend and breakdown
    await firstRow.getByRole("link", { name: `Trend and breakdown of “${top.label}”` }).click();
    await page.waitForURL((url) => url.searchParams.get("error") === top.error);
    await page.getByRole("heading", { name: top.label, level: 2 }).waitFor();
    const selected = await api<TechniqueErrorsAnswer>(page, `/api/insight/errors?quarter=${SEED_QUARTER}&error=${top.error}`);
    const withError = selected.body.selected!.byProfile.reduce((sum, row) => sum + row.count, 0);
    await page
      .getByText(`${withError} of ${selected.body.selected!.byProfile.reduce((sum, row) => sum + row.attempts, 0)} attempts in the period have this error.`)
      .waitFor();
    const breakdown = page.getByRole("table", { name: "Attempts with the error by patient type" });
    await breakdown.waitFor();
    await journey.visited(page, "error-breakdown");

    // the breakdown's groups lead to their attempts
    const biggest = [...selected.body.selected!.byProfile].sort((a, b) => b.count - a.count)[0];
    expect(await breakdown.getByRole("link", { name: new RegExp(`^${biggest.count} attempts? with this error, patient type`) }).getAttribute("href")).toContain(
      `error=${top.error}`,
    );

    // click 2: straight to the attempts with this error that hold a compression stream
    await page.getByRole("link", { name: "Only those with a compression stream" }).click();
    await page.waitForURL((url) => url.pathname === "/attempts" && url.searchParams.get("error") === top.error && url.searchParams.get("stream") === "yes");
    const table = page.getByRole("table", { name: "Attempts" });
    await table.waitFor();
    await page.locator('[aria-busy="true"]').waitFor({ state: "detached" });
    await journey.visited(page, "attempts");
    // the default columns fit the 1360 px window without scrolling sideways
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(1360);
    expect(await table.evaluate((el) => el.getBoundingClientRect().right <= el.parentElement!.getBoundingClientRect().right + 1)).toBe(true);

    // click 3: one attempt with a stream
    const link = table.getByRole("rowheader").first().getByRole("link");
    const attemptId = await textOf(link);
    await link.click();
    await page.waitForURL((url) => url.pathname === `/attempts/${encodeURIComponent(attemptId)}`);
    await page.getByRole("heading", { name: `Attempt ${attemptId}`, level: 1 }).waitFor();

    const detail = await api<AttemptDetailAnswer>(page, `/api/attempts/${encodeURIComponent(attemptId)}`);
    expect(detail.status).toBe(200);
    const { attempt, stream } = detail.body;
    expect(stream).not.toBeNull();
    expect(attempt.errors).toContain(top.error);
    const unit = (await api<{ user: { lengthUnit: LengthUnit } }>(page, "/api/me")).body.user.lengthUnit;

    // the pass rule as a checklist: each criterion's value as the API gives it, never rounded onto its pass mark
    const m = attempt.metrics;
    const rule = detail.body.scoring!.passRule;
    const criteria = page.getByRole("list", { name: "Criteria of the pass rule" });
    const criterionFigure = (name: string, label: string) =>
      criteria
        .getByRole("listitem")
        .filter({ has: page.getByRole("heading", { name, level: 3 }) })
        .locator("dt", { hasText: label })
        .locator("xpath=following-sibling::dd[1]");
    await criteria.waitFor();
    expect(await textOf(criterionFigure("Depth on target", "This attempt"))).toBe(`${besideThreshold(m.depthOkPct, rule.minDepthOkPct)} %`);
    expect(await textOf(criterionFigure("Rate on target", "This attempt"))).toBe(`${besideThreshold(m.rateOkPct, rule.minRateOkPct)} %`);
    expect(await textOf(criterionFigure("Full recoil", "This attempt"))).toBe(`${besideThreshold(m.recoilOkPct, rule.minRecoilOkPct)} %`);
    expect(await textOf(criterionFigure("Hands-on time", "This attempt"))).toBe(`${besideThreshold(m.handsOnPct, rule.minHandsOnPct)} %`);
    expect(await textOf(criterionFigure("Longest pause", "This attempt"))).toBe(`${besideThreshold(m.longestPauseS, rule.maxLongestPauseS, 1)} s`);
    expect(await textOf(criterionFigure("Depth on target", "Pass mark"))).toBe(`at least ${rule.minDepthOkPct} %`);
    // as many criteria missed as the attempt has errors; the composite score only in its modest place
    expect(await textOf(page.locator("#rule-verdict"))).toBe(
      attempt.passed ? "Passed: every criterion met" : `Not passed: ${attempt.errors.length} of 5 criteria missed`,
    );
    expect(await textOf(page.getByRole("region", { name: "Among the network" }))).toContain(`Composite score ${Math.round(attempt.score)} of 100`);

    // the compressions: time in the band and the distributions, each compression on demand, each a labelled picture
    await page.getByRole("heading", { name: "Compressions", level: 2 }).waitFor();
    const ribbon = chart(page, "Time in the band");
    await picture(ribbon).waitFor();
    expect(await textOf(ribbon.locator("p").first())).toContain(`Across the ${stream!.compressions} compressions`);
    await picture(chart(page, "How deep the compressions were")).waitFor();
    await journey.visited(page, "attempt");
    await page.getByRole("button", { name: "Show each compression" }).click();
    const depth = chart(page, "Depth of each compression");
    await picture(depth).waitFor();
    expect(await depth.locator('div[role="img"]').getAttribute("aria-labelledby")).toBe(
      await depth.getByRole("heading", { name: "Depth of each compression" }).getAttribute("id"),
    );
    expect(await textOf(depth.locator("p").first())).toContain(`${stream!.compressions} compressions`);
    expect(m.compressions).toBe(stream!.compressions);
    await journey.visited(page, "attempt-each-compression");

    // the depth chart's table view: one row per compression of the stream
    await depth.getByRole("button", { name: "Show as table" }).click();
    const depthRows = depth.locator("tbody tr");
    await depthRows.first().waitFor();
    expect(await depthRows.count()).toBe(stream!.compressions);
    const firstCells = await depthRows.first().locator("th, td").allTextContents();
    expect(Number(firstCells[0])).toBe(1);
    expect(Number(firstCells[2])).toBe(Number(fromMm(stream!.depth_mm[0], unit).toFixed(unit === "in" ? 2 : 1)));
    await journey.visited(page, "attempt-depth-table", { axe: false });

    // back to the same filtered list
    await page.getByRole("main").getByRole("link", { name: "Back to attempts" }).click();
    await page.waitForURL((url) => url.pathname === "/attempts" && url.searchParams.get("error") === top.error && url.searchParams.get("stream") === "yes");
    await page.getByRole("table", { name: "Attempts" }).getByRole("link", { name: attemptId }).waitFor();

    expect(journey.findings, describeFindings(journey.findings)).toEqual([]);
  });

  test("opens the manikin flagged for a depth sensor check from the Equipment page and sees the evidence", async ({ qualityLeadPage: page, journey }) => {
    await page.waitForURL((url) => url.pathname === "/overview");

    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Equipment" }).click();
    await page.waitForURL((url) => url.pathname === "/equipment");
    // one quarter holds too few shared classes to judge a manikin: look at the last four
    await page.getByRole("combobox", { name: "Period" }).selectOption("last-4");
    await page.waitForURL((url) => url.searchParams.get("quarter") === "last-4");
    const drift = await api<DriftAnswer>(page, "/api/equipment/drift?from=2026-Q1&to=2026-Q4");
    expect(drift.status).toBe(200);
    const flagged = drift.body.manikins.filter((m) => m.flag === "check");
    expect(flagged.map((m) => m.manikin)).toEqual([DEMO_SCENARIO.driftingSensor.manikin]);
    const assetId = flagged[0].manikin;
    const section = page.getByRole("region", { name: "Depth readings against peers" });
    await section.getByText(new RegExp(`^${assetId} reads \\+\\d\\.\\d mm against its peers$`)).waitFor();
    await journey.visited(page, "equipment-drift");

    await section.getByRole("link", { name: `Open ${assetId}’s record` }).click();
    await page.waitForURL((url) => url.pathname === `/equipment/manikins/${assetId}` && url.searchParams.get("quarter") === "last-4");
    await page.getByRole("heading", { name: `Manikin ${assetId}`, level: 1 }).waitFor();
    const record = await api<ManikinRecord>(page, `/api/equipment/manikins/${assetId}?from=2026-Q1&to=2026-Q4`);
    expect(record.status).toBe(200);
    const offset = record.body.drift!.offset_mm!;
    expect(record.body.drift!.flag).toBe("check");
    // the verdict in words with the API's classes and offset, and the class-by-class evidence as a labelled picture
    await page
      .getByText(
        `Check the depth sensor: over ${record.body.drift!.classes} shared classes, ${assetId} reads +${offset.toFixed(1)} mm (deeper) against its peers`,
        { exact: false },
      )
      .waitFor();
    const evidence = chart(page, `${assetId}: depth against its peers, class by class`);
    await picture(evidence).waitFor();
    await evidence.getByRole("button", { name: "Show as table" }).click();
    expect(await evidence.locator("tbody tr").count()).toBe(record.body.drift!.differences.length);
    await page.getByRole("table", { name: `Equipment log of ${assetId}` }).waitFor();
    await journey.visited(page, "manikin");

    // back to the equipment page with the period kept
    await page.getByRole("main").getByRole("link", { name: "Equipment", exact: true }).click();
    await page.waitForURL((url) => url.pathname === "/equipment" && url.searchParams.get("quarter") === "last-4");

    expect(journey.findings, describeFindings(journey.findings)).toEqual([]);
  });
});
