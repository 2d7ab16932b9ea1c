// The quality lead records an improvement action, finds it marked on the error trend chart of its aim, and
// follows the mark to the action's before/after evaluation and its monthly run chart. What the screens show
// is checked against the API's answers.
import type { Page } from "@playwright/test";
import type { ActionDetailAnswer, ActionMark } from "../../shared/schemas/actions";
import { describeFindings } from "./support/a11y";
import { demoAccount } from "./support/accounts";
import { expect, test } from "./support/fixtures";
import { api, textOf } from "./support/pages";
import { SEED_QUARTER } from "./support/seed";

const qualityLead = demoAccount("quality_lead");
const title = "Recoil reminder at the start of every class";
const verdictWords = { up: "higher after the start", down: "lower after the start", "no clear change": "no clear change" } as const;

async function expectEvaluation(page: Page, id: number) {
  await page.getByRole("heading", { name: "Before and after" }).waitFor();
  const detail = await api<ActionDetailAnswer>(page, `/api/actions/${id}`);
  expect(detail.status).toBe(200);
  const evaluation = detail.body.evaluation!;
  expect(evaluation.verdict).not.toBeNull();
  expect(await textOf(page.getByTestId("difference"))).toContain(verdictWords[evaluation.verdict!]);
  expect(await textOf(page.getByTestId("monthly-signal"))).toMatch(/^The median is \d+\.\d % after the start against \d+\.\d % before it\./);
}

test.describe("quality lead and an improvement action", () => {
  test("records an action, sees it marked on its error's trend chart and follows the mark to its evaluation", async ({ qualityLeadPage: page, journey }) => {
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Improvement actions" }).click();
    await page.waitForURL((url) => url.pathname === "/actions");
    await page.getByRole("button", { name: "Record action" }).click();

    const form = page.getByRole("dialog");
    await form.getByLabel("What is being done").fill(title);
    await form.getByLabel("Aim").selectOption("incomplete_recoil");
    await form.getByLabel("Target (%)").fill("15");
    await form.getByLabel("Start date").fill("2026-04-01");
    await form.getByLabel("Owner").fill(qualityLead.displayName);
    await form.getByLabel("Status").selectOption("under_way");
    await journey.visited(page, "action-form");
    await form.getByRole("button", { name: "Record action" }).click();

    await page.waitForURL((url) => /^\/actions\/\d+$/.test(url.pathname));
    const id = Number(new URL(page.url()).pathname.split("/").pop());
    await page.getByRole("heading", { name: title }).waitFor();
    await expectEvaluation(page, id);
    await journey.visited(page, "action-recorded");

    // the error trend chart of the aim marks the action at its start quarter
    await page.goto(`/errors?quarter=${SEED_QUARTER}&error=incomplete_recoil`);
    const trend = page.locator("figure").filter({ has: page.getByRole("heading", { name: "Trend by quarter", exact: true }) });
    await trend.waitFor();
    const marks = await api<{ marks: ActionMark[] }>(page, "/api/actions/marks?from=2025-Q1&to=2026-Q4");
    const number = marks.body.marks.findIndex((mark) => mark.id === id) + 1;
    expect(number).toBeGreaterThan(0);
    await page.getByText(`A${number} ${title} (from 1 Apr 2026, 2026 Q2)`).first().waitFor();
    // the chart redraws once the marks have arrived: the numbered label at the start quarter, whose tooltip
    // (a <title> inside the <text>) names the action
    await trend
      .locator('div[role="img"] svg text')
      .filter({ hasText: new RegExp(`^A${number}${title}, from 1 Apr 2026$`) })
      .first()
      .waitFor();
    await journey.visited(page, "error-trend-marked");

    // the mark leads to the action's evaluation
    await page.getByRole("link", { name: title, exact: true }).click();
    await page.waitForURL((url) => url.pathname === `/actions/${id}`);
    await expectEvaluation(page, id);
    await journey.visited(page, "action-evaluation", { axe: false });

    expect(journey.pageErrors).toEqual([]);
    expect(journey.findings, describeFindings(journey.findings)).toEqual([]);
  });
});
