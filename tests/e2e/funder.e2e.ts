// A funder: is told by e-mail that a report version was released, follows the message's link, opens the
// quarter's latest released report (never a version the coordinator has not released), downloads its PDF, and
// is refused every drill-down page (and the API behind them) that would show instructors, errors, classes or
// single attempts.
import fs from "node:fs";
import { defaultPeriod } from "../../shared/period";
import { describeFindings } from "./support/a11y";
import { demoAccount } from "./support/accounts";
import { expect, test } from "./support/fixtures";
import { api, apiPost, signIn } from "./support/pages";

const funder = demoAccount("funder");
const coordinator = demoAccount("coordinator");

/** The period the report page opens on: the latest quarter that has ended (by the browser's clock). */
let period: string;
let versionId: number;
let versionNumber: number;
/** A newer version the coordinator has not released: funders must not see it. */
let draftId: number;

test.beforeAll(async ({ browser }) => {
  // the coordinator stores and releases a new version of the report, so the test knows which PDF funders
  // must get, then stores a newer one without releasing it
  const context = await browser.newContext();
  const page = await context.newPage();
  await signIn(page, coordinator);
  const options = await api<{ quarters: string[] }>(page, "/api/insight/options");
  period = defaultPeriod(options.body.quarters)!;
  const created = await apiPost<{ report: { id: number; version: number } }>(page, `/api/reports/${period}`);
  expect(created.status).toBe(201);
  versionId = created.body.report.id;
  versionNumber = created.body.report.version;
  const released = await apiPost<{ released: boolean; notified: string[] }>(page, `/api/reports/${versionId}/release`);
  expect(released.status).toBe(200);
  expect(released.body.released).toBe(true);
  expect(released.body.notified.map((a) => a.toLowerCase())).toContain(funder.email.toLowerCase());
  const draft = await apiPost<{ report: { id: number } }>(page, `/api/reports/${period}`);
  expect(draft.status).toBe(201);
  draftId = draft.body.report.id;
  await context.close();
});

test.describe("funder", () => {
  test("follows the release notice to the quarter's released report, downloads its PDF, and is refused drafts and every drill-down", async ({
    funderPage: page,
    journey,
    database,
  }) => {
    // the release notice: one message to this funder alone, with the report's address
    const notices = database.prepare("SELECT recipients, subject, text FROM mailbox WHERE subject LIKE '%released' ORDER BY id").all() as {
      recipients: string;
      subject: string;
      text: string;
    }[];
    const addressed = (m: { recipients: string }) => (JSON.parse(m.recipients) as string[]).map((a) => a.toLowerCase());
    const mine = notices.filter((m) => addressed(m).includes(funder.email.toLowerCase()));
    expect(mine).toHaveLength(1);
    expect(addressed(mine[0])).toEqual([funder.email.toLowerCase()]);
    expect(mine[0].text).toContain(`Version ${versionNumber} of the training quality report`);
    const link = /Read it and download its PDF at (\S+)/.exec(mine[0].text)![1];
    expect(new URL(link).pathname + new URL(link).search).toBe(`/report?period=${period}`);

    // the report is the funder's start page; the notice's link opens the same released version
    await page.waitForURL((url) => url.pathname === "/report");
    await page.goto(new URL(link).pathname + new URL(link).search);
    await page.waitForURL((url) => url.pathname === "/report");
    await page.getByRole("heading", { name: "Funder report", level: 1 }).waitFor();
    const download = page.getByRole("link", { name: /^Download PDF/ });
    await download.waitFor();
    expect(await download.getAttribute("href")).toBe(`/api/reports/${versionId}/pdf`);
    await page.getByText(`You are reading version ${versionNumber}`).waitFor();
    expect(await page.getByRole("radio", { name: "Today's figures" }).count()).toBe(0);
    expect(await page.getByRole("combobox", { name: "Quarter" }).inputValue()).toBe(period);
    await page.getByText(new RegExp(`^Period ${period}`)).waitFor();
    await journey.visited(page, "report");

    const downloaded = page.waitForEvent("download");
    await download.click();
    const file = await downloaded;
    expect(file.suggestedFilename()).toMatch(/\.pdf$/);
    const saved = await file.path();
    const head = fs.readFileSync(saved).subarray(0, 5).toString("latin1");
    expect(head).toBe("%PDF-");

    // the navigation offers none of the drill-down pages
    const nav = page.getByRole("navigation", { name: "Main" });
    for (const name of ["Instructors", "Error trends", "Attempts", "Network overview"]) {
      expect(await nav.getByRole("link", { name, exact: true }).count(), `nav link ${name}`).toBe(0);
    }

    // a class and an attempt of the network, typed into the address bar
    const anAttempt = database.prepare("SELECT id, class_id AS classId, learner FROM attempts ORDER BY id LIMIT 1").get() as {
      id: string;
      classId: string;
      learner: string;
    };
    const pages = ["/instructors", "/errors", "/attempts", `/attempts/${anAttempt.id}`, `/classes/${anAttempt.classId}`];
    for (const [i, path] of pages.entries()) {
      await page.goto(path);
      await page.getByRole("heading", { name: "Not available for your role", level: 1 }).waitFor();
      const main = (await page.locator("main").textContent()) ?? "";
      expect(main).toContain("You are signed in as funder");
      expect(main).not.toContain(anAttempt.learner);
      if (i === 0) await journey.visited(page, "drill-down-refused");
      else await journey.shot(page, `refused-${path.slice(1).replace(/\//g, "-")}`);
    }

    // the API behind those pages refuses the funder too
    const apiPaths = [
      "/api/insight/instructors",
      "/api/insight/errors",
      "/api/attempts",
      `/api/attempts/${anAttempt.id}`,
      `/api/classes/${anAttempt.classId}`,
      "/api/insight/overview",
    ];
    const statuses = Object.fromEntries(await Promise.all(apiPaths.map(async (path) => [path, (await api(page, path)).status] as const)));
    expect(statuses).toEqual(Object.fromEntries(apiPaths.map((path) => [path, 403])));
    // while the released report's own PDF is open to them; the draft and today's figures are not
    const pdf = await page.request.get(`/api/reports/${versionId}/pdf`);
    expect(pdf.status()).toBe(200);
    expect((await page.request.get(`/api/reports/${draftId}/pdf`)).status()).toBe(404);
    expect((await api(page, `/api/reports/${period}/preview`)).status).toBe(403);

    expect(journey.findings, describeFindings(journey.findings)).toEqual([]);
  });
});
