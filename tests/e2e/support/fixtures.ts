// The journeys' test fixtures: the served database to read from, a page signed in as each demo role, and the
// journey record of a test (numbered screenshots beside its trace, the accessibility findings of every page
// visited and the errors its pages threw).
import { test as base, type Page } from "@playwright/test";
import Database from "better-sqlite3";
import type { UserRole } from "../../../shared/domain";
import { describeFindings, seriousA11yFindings, type A11yFinding } from "./a11y";
import { demoAccount } from "./accounts";
import { signIn } from "./pages";
import { servedDatabaseFile } from "./seed";

export { expect } from "@playwright/test";

export interface Journey {
  readonly findings: A11yFinding[];
  readonly pageErrors: string[];
  /** Full-page screenshot <nn-step>.png in the test's output folder. */
  shot(page: Page, step: string): Promise<void>;
  /** Runs axe on the page as it stands and keeps its serious and critical findings. */
  checkA11y(page: Page, label: string): Promise<A11yFinding[]>;
  /**
   * Screenshot and accessibility check of a page that has finished loading. axe takes seconds on a large
   * page, so a state already checked (the same page with other numbers) can skip it with `axe: false`.
   */
  visited(page: Page, step: string, options?: { axe?: boolean }): Promise<void>;
}

/** A page of its own browser profile, signed in through the form as the demo account of each role. */
interface SignedInPages {
  coordinatorPage: Page;
  qualityLeadPage: Page;
  instructorPage: Page;
  funderPage: Page;
}

function signedInAs(role: UserRole) {
  // the journey record first, so that errors the sign-in throws are counted too
  return async ({ page, journey: _journey }: { page: Page; journey: Journey }, use: (page: Page) => Promise<void>) => {
    await signIn(page, demoAccount(role));
    await use(page);
  };
}

export const test = base.extend<{ journey: Journey } & SignedInPages, { database: Database.Database }>({
  /** The database the server serves, read-only: what the pages cannot show (mail sent, other people's rows). */
  database: [
    // eslint-disable-next-line no-empty-pattern -- Playwright reads a fixture's dependencies from this pattern; there are none
    async ({}, use) => {
      const database = new Database(servedDatabaseFile(), { readonly: true, fileMustExist: true });
      await use(database);
      database.close();
    },
    { scope: "worker" },
  ],

  journey: async ({ context }, use, testInfo) => {
    const findings: A11yFinding[] = [];
    const pageErrors: string[] = [];
    let step = 0;
    const watch = (page: Page) => page.on("pageerror", (error) => pageErrors.push(`${page.url()}: ${error.message}`));
    context.pages().forEach(watch);
    context.on("page", watch);
    const journey: Journey = {
      findings,
      pageErrors,
      async shot(page, name) {
        step += 1;
        const file = `${String(step).padStart(2, "0")}-${name.replace(/[^a-z0-9-]+/gi, "-").toLowerCase()}.png`;
        await page.screenshot({ path: testInfo.outputPath(file), fullPage: true });
      },
      async checkA11y(page, label) {
        const found = await seriousA11yFindings(page, label);
        if (found.length > 0) console.warn(`Accessibility findings on ${label}:\n${describeFindings(found)}`);
        findings.push(...found);
        return found;
      },
      async visited(page, name, { axe = true } = {}) {
        await journey.shot(page, name);
        if (axe) await journey.checkA11y(page, `${name} (${new URL(page.url()).pathname})`);
      },
    };
    await use(journey);
  },

  coordinatorPage: signedInAs("coordinator"),
  qualityLeadPage: signedInAs("quality_lead"),
  instructorPage: signedInAs("instructor"),
  funderPage: signedInAs("funder"),
});
