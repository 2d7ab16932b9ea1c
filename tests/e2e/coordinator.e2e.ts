// The coordinator's quarter: sign in, import a class log and a device's attempts export whose columns need
// matching (depth in centimetres), see the refused rows named by row, column and reason, upload the
// corrected file, import it, and find the overview's numbers moved to what the API reports. The same sign-in
// and import are then done with the keyboard alone. Last, the funder report: a new version is previewed as
// the PDF it is, sent only with a cover note and after a confirmation naming the period and every recipient.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { Page } from "@playwright/test";
import type { OverviewAnswer } from "../../shared/schemas/insight";
import { defaultPeriod, periodLabel } from "../../shared/period";
import { formatCount, formatPercent } from "../../src/features/insight/format";
import { runCli } from "../faults/helpers";
import { describeFindings } from "./support/a11y";
import { demoAccount, demoDirectory } from "./support/accounts";
import { expect, test } from "./support/fixtures";
import { api, signIn, tabTo, textOf } from "./support/pages";
import { SEED_QUARTER, SEED_TODAY, servedDatabaseFile } from "./support/seed";

const coordinator = demoAccount("coordinator");
const QUARTER = SEED_QUARTER;
const instructor = demoDirectory.instructors[0];

// Two new classes in the current quarter, before the seeded "today" (dates may not lie in the future).
const CLASSES = [
  { id: "E2E-Q-C1", date: `${SEED_TODAY.slice(0, 4)}-11-23` },
  { id: "E2E-Q-C2", date: `${SEED_TODAY.slice(0, 4)}-11-24` },
];
const classLog = [
  "class_id,date,site,instructor,course,learners,passed,manikins",
  ...CLASSES.map((c) => `${c.id},${c.date},${instructor.site},${instructor.code},adult,6,6,`),
].join("\n");

/** A device's own names for the attempt-summary columns: every one needs matching, depth comes in cm. */
const DEVICE_COLUMNS: Record<string, string> = {
  attempt_id: "Session",
  class_id: "Course ref",
  learner: "Trainee",
  manikin: "Unit",
  profile: "Patient",
  feedback: "Display",
  started_at: "Begin",
  duration_s: "Length (s)",
  compressions: "Count",
  rate_cpm: "Avg rate (/min)",
  depth_mm: "Avg depth (cm)",
  depth_ok_pct: "Depth good %",
  too_shallow_pct: "Shallow %",
  too_deep_pct: "Deep %",
  rate_ok_pct: "Rate good %",
  too_slow_pct: "Slow %",
  too_fast_pct: "Fast %",
  recoil_ok_pct: "Release good %",
  hands_on_pct: "On chest %",
  longest_pause_s: "Longest gap (s)",
  instructor_result: "Verdict",
};
const ATTEMPTS = 12;

/** One good attempt's values in Quarterbeat's own column names; depth as the file writes it. */
function goodAttempt(id: string, cls: (typeof CLASSES)[number], learner: string, startedAt: string, depth: string): Record<string, string> {
  return {
    attempt_id: id,
    class_id: cls.id,
    learner,
    manikin: "",
    profile: "adult",
    feedback: "live",
    started_at: startedAt,
    duration_s: "120",
    compressions: "220",
    rate_cpm: "110",
    depth_mm: depth,
    depth_ok_pct: "92",
    too_shallow_pct: "5",
    too_deep_pct: "3",
    rate_ok_pct: "94",
    too_slow_pct: "3",
    too_fast_pct: "3",
    recoil_ok_pct: "96",
    hands_on_pct: "88",
    longest_pause_s: "2.5",
    instructor_result: "pass",
  };
}

const two = (n: number) => String(n).padStart(2, "0");

/** Twelve good attempts, six per class; `faults` replaces values of chosen rows (row 1 = first data row). */
function attemptsFile(faults: Record<number, Partial<Record<string, string>>> = {}): string {
  const columns = Object.keys(DEVICE_COLUMNS);
  const lines = [columns.map((c) => DEVICE_COLUMNS[c]).join(",")];
  for (let row = 1; row <= ATTEMPTS; row += 1) {
    const cls = CLASSES[row <= ATTEMPTS / 2 ? 0 : 1];
    const values: Record<string, string | undefined> = {
      ...goodAttempt(`E2E-Q-A${two(row)}`, cls, `E2E-L${two(row)}`, `${cls.date}T10:${two(row * 3)}:00Z`, "5.5"),
      feedback: row % 2 === 0 ? "hidden" : "live",
      ...faults[row],
    };
    lines.push(columns.map((c) => values[c]).join(","));
  }
  return lines.join("\n");
}

/** More attempts for the first new class, in Quarterbeat's own columns (depth in mm), as the CLI imports them. */
function cliAttemptsFile(count: number): string {
  const columns = Object.keys(DEVICE_COLUMNS);
  const lines = [columns.join(",")];
  for (let row = 1; row <= count; row += 1) {
    const values = goodAttempt(`E2E-Q-B${two(row)}`, CLASSES[0], `E2E-M${two(row)}`, `${CLASSES[0].date}T11:${two(row * 3)}:00Z`, "55");
    lines.push(columns.map((c) => values[c]).join(","));
  }
  return `${lines.join("\n")}\n`;
}
const CLI_ATTEMPTS = 4;
/** How long a page may take to draw an answer it has asked for, on a busy machine. */
const SETTLE = { timeout: 15_000, intervals: [100] };

const BAD_ROWS = { 3: { rate_cpm: "400" }, 7: { learner: "Ann Example" } };

const csv = (name: string, text: string) => ({ name, mimeType: "text/csv", buffer: Buffer.from(`${text}\n`, "utf8") });

/** The big number of the overview's stat card with this label. */
function statValue(page: Page, label: string) {
  return page.getByRole("heading", { name: label, exact: true }).locator("xpath=..").locator("p").first();
}

async function overviewFromApi(page: Page): Promise<OverviewAnswer> {
  const answer = await api<OverviewAnswer>(page, `/api/insight/overview?quarter=${QUARTER}`);
  expect(answer.status).toBe(200);
  return answer.body;
}

async function chooseFile(page: Page, kindLabel: string, file: ReturnType<typeof csv>) {
  await page.getByRole("radio", { name: new RegExp(`^${kindLabel}`) }).check();
  await page.getByLabel("CSV file").setInputFiles(file);
  await page.getByRole("button", { name: "Upload and preview" }).click();
  await page.getByRole("heading", { name: "Step 2 of 4: Match the columns" }).waitFor();
}

/** The mapping step: every Quarterbeat column read from the device's column, depth in centimetres. */
async function matchDeviceColumns(page: Page) {
  for (const [column, source] of Object.entries(DEVICE_COLUMNS)) {
    await page.getByRole("combobox", { name: `File column for ${column}`, exact: true }).selectOption(source);
  }
  await page.getByRole("radio", { name: "centimetres (cm)" }).check();
  // the first row's depth shown converted, so a wrong unit is visible before validating
  await page.getByText("First row: 5.5 cm → 55 mm").waitFor();
  await page.getByText("Every required column is matched.").waitFor({ state: "attached" });
}

test.describe("coordinator", () => {
  test("imports a quarter's class log and a device's attempts, fixes a refused file, and sees the overview follow", async ({ page, journey }) => {
    await page.goto("/sign-in");
    await page.getByRole("heading", { name: "Sign in" }).waitFor();
    await journey.visited(page, "sign-in");
    await signIn(page, coordinator);

    // the landing page shows the latest quarter, which the API agrees with
    await page.waitForURL((url) => url.pathname === "/overview" && url.searchParams.get("quarter") === QUARTER);
    const before = await overviewFromApi(page);
    await expect.poll(() => textOf(statValue(page, "Attempts measured"))).toBe(formatCount(before.attempts));
    expect(await textOf(statValue(page, "Measured pass rate"))).toBe(formatPercent(before.passRate.rate));
    await journey.visited(page, "overview-before");

    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Imports" }).click();
    await page.getByRole("heading", { name: "Step 1 of 4: Choose the file" }).waitFor();
    await journey.visited(page, "imports");

    // class log: Quarterbeat's own columns, straight through
    await chooseFile(page, "Class logs", csv("quarter-classes.csv", classLog));
    await journey.visited(page, "classes-mapping", { axe: false });
    await page.getByRole("button", { name: "Validate the file" }).click();
    await page.getByText(`All ${CLASSES.length} rows can be imported. Nothing has been written yet.`).waitFor();
    await page.getByRole("button", { name: `Import ${CLASSES.length} rows` }).click();
    await page.getByText(/quarter-classes\.csv is imported as batch \d+/).waitFor();
    await journey.visited(page, "classes-imported", { axe: false });

    // attempts from a device: columns matched by hand, depth in cm; two rows are bad
    await page.getByRole("button", { name: "Import another file" }).click();
    await chooseFile(page, "Attempt summaries", csv("device-attempts.csv", attemptsFile(BAD_ROWS)));
    await matchDeviceColumns(page);
    await journey.visited(page, "attempts-mapping");
    await page.getByRole("button", { name: "Validate the file" }).click();
    await page.getByText(`2 rows of ${ATTEMPTS} have problems. Nothing has been written yet.`).waitFor();

    // each refused row named on screen: row, column, reason
    const problems = page.getByRole("table", { name: "Problems found" });
    const problemRows = problems.locator("tbody tr");
    await expect.poll(() => problemRows.count()).toBe(2);
    const shown = await problemRows.evaluateAll((rows) =>
      rows.map((row) => Array.from(row.querySelectorAll("th, td"), (cell) => (cell.textContent ?? "").trim())),
    );
    expect(shown.map((cells) => cells.slice(0, 2))).toEqual([
      ["3", "rate_cpm"],
      ["7", "learner"],
    ]);
    for (const cells of shown) expect(cells[2].length).toBeGreaterThan(10);
    expect(shown[0][2]).toMatch(/400|300/);
    expect(shown[1][2].toLowerCase()).toMatch(/space|name|code/);
    // nothing imported: the overview's figures are the same as before
    expect((await overviewFromApi(page)).attempts).toBe(before.attempts);
    await page.getByRole("button", { name: /^Import \d+ rows$/ }).waitFor(); // only after a choice to skip
    expect(await page.getByRole("button", { name: /^Import \d+ rows$/ }).isDisabled()).toBe(true);
    await journey.visited(page, "attempts-refused");

    // the corrected file
    await page.getByRole("button", { name: "Upload a corrected file" }).click();
    await page.getByRole("heading", { name: "Step 1 of 4: Choose the file" }).waitFor();
    await chooseFile(page, "Attempt summaries", csv("device-attempts-corrected.csv", attemptsFile()));
    await matchDeviceColumns(page);
    await page.getByRole("button", { name: "Validate the file" }).click();
    await page.getByText(`All ${ATTEMPTS} rows can be imported. Nothing has been written yet.`).waitFor();
    await journey.visited(page, "attempts-valid", { axe: false });
    await page.getByRole("button", { name: `Import ${ATTEMPTS} rows` }).click();
    await page.getByText(/device-attempts-corrected\.csv is imported as batch \d+/).waitFor();
    await journey.visited(page, "attempts-imported");

    // the overview moves to the API's new figures, written as the page writes them
    const after = await overviewFromApi(page);
    expect(after.attempts).toBe((before.attempts ?? 0) + ATTEMPTS);
    expect(after.passRate.rate).not.toBe(before.passRate.rate);
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Network overview" }).click();
    await page.waitForURL((url) => url.pathname === "/overview" && url.searchParams.get("quarter") === QUARTER);
    // no waiting for answers to go stale: the import invalidated them (the timeout only allows for a busy machine)
    await expect.poll(() => textOf(statValue(page, "Attempts measured")), SETTLE).toBe(formatCount(after.attempts));
    await expect.poll(() => textOf(statValue(page, "Measured pass rate")), SETTLE).toBe(formatPercent(after.passRate.rate));
    await journey.visited(page, "overview-after", { axe: false });

    // a CLI import while the overview is open: the page follows when the window regains focus
    const cliDir = fs.mkdtempSync(path.join(os.tmpdir(), "qb-e2e-cli-"));
    const cliFile = path.join(cliDir, "more-attempts.csv");
    fs.writeFileSync(cliFile, cliAttemptsFile(CLI_ATTEMPTS));
    const cli = await runCli(servedDatabaseFile(), ["import", "attempts", cliFile]);
    fs.rmSync(cliDir, { recursive: true, force: true });
    expect(cli.code, cli.stderr).toBe(0);
    const afterCli = await overviewFromApi(page);
    expect(afterCli.attempts).toBe((after.attempts ?? 0) + CLI_ATTEMPTS);
    await page.evaluate(() => window.dispatchEvent(new Event("focus")));
    await expect.poll(() => textOf(statValue(page, "Attempts measured")), SETTLE).toBe(formatCount(afterCli.attempts));

    expect(journey.findings, describeFindings(journey.findings)).toEqual([]);
  });

  test("signs in and imports a class log with the keyboard alone", async ({ page, journey }) => {
    // one column under another name, matched with the keyboard
    const keyboardLog = [
      "class_id,date,site,instructor,Programme,learners,passed,manikins",
      `E2E-K-C1,${CLASSES[0].date},${instructor.site},${instructor.code},child,4,3,`,
    ].join("\n");

    await page.goto("/sign-in");
    await tabTo(page, page.getByLabel("E-mail address"));
    await page.keyboard.type(coordinator.email);
    await page.keyboard.press("Tab");
    await page.keyboard.type(coordinator.password);
    await page.keyboard.press("Enter");
    await page.waitForURL((url) => url.pathname === "/overview");

    await tabTo(page, page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Imports" }));
    await page.keyboard.press("Enter");
    await page.waitForURL((url) => url.pathname === "/imports");

    // the kinds are one radio group: Tab into it, arrows move the choice, Space confirms
    const classLogs = page.getByRole("radio", { name: /^Class logs/ });
    const attempts = page.getByRole("radio", { name: /^Attempt summaries/ });
    await tabTo(page, classLogs);
    await page.keyboard.press("Space");
    await page.keyboard.press("ArrowDown");
    expect(await attempts.isChecked()).toBe(true);
    await page.keyboard.press("ArrowUp");
    expect(await classLogs.isChecked()).toBe(true);

    // the file input opens the file chooser from the keyboard
    // (on a busy machine the first key press can land while the page is still settling: press again, focused)
    let chosen = false;
    for (let tries = 0; tries < 3 && !chosen; tries += 1) {
      await tabTo(page, page.getByLabel("CSV file"));
      const chooser = page.waitForEvent("filechooser", { timeout: 8000 }).catch(() => null);
      await page.keyboard.press("Space");
      const opened = await chooser;
      if (opened) {
        await opened.setFiles(csv("keyboard-classes.csv", keyboardLog));
        chosen = true;
      }
    }
    expect(chosen).toBe(true);
    await page.getByText("Chosen: keyboard-classes.csv").waitFor();
    await tabTo(page, page.getByRole("button", { name: "Upload and preview" }));
    await page.keyboard.press("Enter");
    const step2 = page.getByRole("heading", { name: "Step 2 of 4: Match the columns" });
    await step2.waitFor();
    expect(await step2.evaluate((el) => el === document.activeElement)).toBe(true);

    // "Programme" holds the course: choose it in the course's list by typing its first letters
    const course = page.getByRole("combobox", { name: "File column for course", exact: true });
    if ((await course.inputValue()) !== "Programme") {
      await tabTo(page, course);
      await page.keyboard.type("Prog");
    }
    expect(await course.inputValue()).toBe("Programme");
    await page.getByText("Every required column is matched.").waitFor({ state: "attached" });
    await journey.shot(page, "keyboard-mapping");

    await tabTo(page, page.getByRole("button", { name: "Validate the file" }));
    await page.keyboard.press("Enter");
    await page
      .getByText("All 1 rows can be imported. Nothing has been written yet.")
      .or(page.getByText("All 1 row can be imported. Nothing has been written yet."))
      .waitFor();
    const importButton = page.getByRole("button", { name: "Import 1 row" });
    await tabTo(page, importButton);
    await page.keyboard.press("Enter");
    await page.getByText(/keyboard-classes\.csv is imported as batch \d+/).waitFor();
    await journey.visited(page, "keyboard-imported", { axe: false });

    const batches = await api<{ batches: { fileName: string; inserted: number; source: string }[] }>(page, "/api/imports/batches?limit=1");
    expect(batches.body.batches[0]).toMatchObject({ fileName: "keyboard-classes.csv", inserted: 1, source: "web" });
  });

  test("previews the report as its PDF, writes a cover note, confirms period and recipients, and sends", async ({
    coordinatorPage: page,
    journey,
    database,
  }) => {
    const options = await api<{ quarters: string[] }>(page, "/api/insight/options");
    const period = defaultPeriod(options.body.quarters)!;
    await page.goto(`/report?period=${period}`);
    await page.getByRole("heading", { name: "Funder report", level: 1 }).waitFor();

    // a version of its own, so the step knows which PDF goes out
    await page.getByRole("button", { name: "Create report version" }).click();
    await page.getByText(/is stored \(PDF, /).waitFor();
    // on a phone the page, versions table included, stays within the screen's width
    await page.setViewportSize({ width: 390, height: 844 });
    await page.getByRole("table", { name: new RegExp("^Report versions for") }).waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await page.setViewportSize({ width: 1360, height: 900 });
    const stored = await api<{ reports: { id: number; version: number }[] }>(page, `/api/reports?period=${period}`);
    const latest = stored.body.reports[0];
    const users = await api<{ users: { email: string; role: string; active: boolean }[] }>(page, "/api/users");
    const funders = users.body.users.filter((u) => u.role === "funder" && u.active).map((u) => u.email.toLowerCase());

    const send = page.getByRole("region", { name: "Send to funders" });
    // nothing goes without a cover note
    await send.getByRole("button", { name: "Review before sending" }).click();
    await send.getByText("Write a cover note for the funders").waitFor();
    const coverNote = "Dear funders, here is our report for the quarter.";
    await send.getByRole("textbox", { name: /Cover note/ }).fill(coverNote);
    await send.getByRole("button", { name: "Review before sending" }).click();

    // the confirmation: period and version, every recipient, the note and the stored PDF itself
    await send.getByRole("heading", { name: `Check before sending: ${periodLabel(period)}, version ${latest.version}` }).waitFor();
    const recipients = await send.getByRole("list", { name: "Recipients" }).getByRole("listitem").allTextContents();
    expect(recipients).toEqual(funders);
    expect(await send.locator("iframe").getAttribute("src")).toBe(`/api/reports/${latest.id}/pdf?inline=1`);
    expect(await send.getByRole("link", { name: `Download the PDF of version ${latest.version}` }).getAttribute("href")).toBe(`/api/reports/${latest.id}/pdf`);
    // no axe here: the check would have to reach into the browser's own PDF viewer in the frame; the page
    // itself is checked after the send
    await journey.visited(page, "report-send-check", { axe: false });

    await send.getByRole("button", { name: `Send to ${recipients.length} recipient${recipients.length === 1 ? "" : "s"}` }).click();
    // the journeys' mail goes to the local mail service: one message per recipient, each with the PDF
    await send.getByText(/was sent to/).waitFor();
    const sends = await api<{ sends: { reportId: number; coverNote: string; recipients: string[]; status: string }[] }>(page, "/api/report-sends");
    expect(sends.body.sends[0]).toMatchObject({ reportId: latest.id, coverNote, recipients: funders, status: "sent" });
    const messages = database.prepare("SELECT recipients, attachments FROM mailbox WHERE text LIKE ?").all(`%${coverNote.slice(0, 40)}%`) as {
      recipients: string;
      attachments: string;
    }[];
    expect(messages.map((m) => JSON.parse(m.recipients) as string[]).sort()).toEqual(funders.map((f) => [f]).sort());
    for (const m of messages) expect((JSON.parse(m.attachments) as { contentType: string }[]).map((a) => a.contentType)).toContain("application/pdf");
    await journey.visited(page, "report-sent");
  });
});
