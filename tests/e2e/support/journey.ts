// Everything one journey file needs: its own seeded database, the app serving the built client, Chromium,
// numbered screenshots under test-results/e2e/<journey>/, sign-in through the form, the API asked with the
// page's own cookies, and the accessibility findings of every page visited.
import fs from "node:fs";
import path from "node:path";
import type { Browser, BrowserContext, Locator, Page } from "playwright-core";
import type { Db } from "../../../server/db/client";
import { describeFindings, seriousA11yFindings, type A11yFinding } from "./a11y";
import { launchChromium } from "./browser";
import { builtClientDir, repoRoot } from "./client";
import { seededDatabase } from "./database";
import { startApp, type RunningApp } from "./server";

/** A whole journey: a dozen pages, each waited for, with an accessibility scan on most of them. */
export const JOURNEY_TIMEOUT = 300_000;
/** Start-up: the first journey of a run may build the client and seed the demo network. */
export const SETUP_TIMEOUT = 420_000;

export interface ApiAnswer<T> {
  status: number;
  body: T;
}

export class Journey {
  readonly findings: A11yFinding[] = [];
  readonly pageErrors: string[] = [];
  private step = 0;
  private lastPage: Page | null = null;

  private constructor(
    readonly name: string,
    readonly db: Db,
    /** The SQLite file the server serves, for writes made from outside the page (a CLI import). */
    readonly dbFile: string,
    private readonly dbDir: string,
    private readonly app: RunningApp,
    readonly browser: Browser,
    readonly shotsDir: string,
  ) {}

  static async start(name: string): Promise<Journey> {
    const clientDir = await builtClientDir();
    const { db, file, dir } = await seededDatabase(name);
    const app = await startApp(db, clientDir);
    const browser = await launchChromium();
    const shotsDir = path.join(repoRoot, "test-results/e2e", name);
    fs.rmSync(shotsDir, { recursive: true, force: true });
    fs.mkdirSync(shotsDir, { recursive: true });
    return new Journey(name, db, file, dir, app, browser, shotsDir);
  }

  get baseUrl(): string {
    return this.app.baseUrl;
  }

  url(pathname: string): string {
    return `${this.app.baseUrl}${pathname}`;
  }

  /** A new browser profile (own cookies) with one page, desktop-sized, downloads allowed. */
  async newPage(): Promise<{ context: BrowserContext; page: Page }> {
    const context = await this.browser.newContext({ baseURL: this.app.baseUrl, viewport: { width: 1360, height: 900 }, acceptDownloads: true, locale: "en-GB", timezoneId: "UTC" });
    // a missing element fails the step with its name well before the test's own time limit
    context.setDefaultTimeout(30_000);
    const page = await context.newPage();
    this.lastPage = page;
    page.on("pageerror", (error) => this.pageErrors.push(`${page.url()}: ${error.message}`));
    return { context, page };
  }

  /** Full-page screenshot test-results/e2e/<journey>/<nn-step>.png. */
  async shot(page: Page, step: string): Promise<void> {
    this.step += 1;
    const file = `${String(this.step).padStart(2, "0")}-${step.replace(/[^a-z0-9-]+/gi, "-").toLowerCase()}.png`;
    await page.screenshot({ path: path.join(this.shotsDir, file), fullPage: true });
  }

  /** Signs in through the form and waits until the app has left the sign-in page. */
  async signIn(page: Page, email: string, password: string): Promise<void> {
    await page.goto("/sign-in");
    await page.getByLabel("E-mail address").fill(email);
    await page.getByLabel("Password").fill(password);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
  }

  /** GET an API path with the page's cookies (the signed-in user). */
  async api<T = unknown>(page: Page, pathname: string): Promise<ApiAnswer<T>> {
    const response = await page.request.get(this.url(pathname));
    const text = await response.text();
    let body: unknown = text;
    try {
      body = JSON.parse(text);
    } catch {
      // not JSON: keep the text
    }
    return { status: response.status(), body: body as T };
  }

  /** POST to an API path as the page's user, with the CSRF token the session hands out. */
  async apiPost<T = unknown>(page: Page, pathname: string, body: object = {}): Promise<ApiAnswer<T>> {
    const me = await this.api<{ csrfToken: string }>(page, "/api/me");
    const response = await page.request.post(this.url(pathname), { data: body, headers: { "x-csrf-token": me.body.csrfToken } });
    const text = await response.text();
    return { status: response.status(), body: (text ? JSON.parse(text) : null) as T };
  }

  /** Runs axe on the page as it stands and keeps its serious and critical findings. */
  async checkA11y(page: Page, label: string): Promise<A11yFinding[]> {
    const t0 = Date.now();
    const found = await seriousA11yFindings(page, label);
    if (process.env.QB_E2E_TIMING) console.log(`axe ${label}: ${Date.now() - t0} ms`);
    if (found.length > 0) console.warn(`Accessibility findings on ${label}:\n${describeFindings(found)}`);
    this.findings.push(...found);
    return found;
  }

  /**
   * Screenshot and accessibility check of a page that has finished loading. axe takes seconds on a large
   * page, so a state already checked (the same page with other numbers) can skip it with `axe: false`.
   */
  async visited(page: Page, step: string, { axe = true }: { axe?: boolean } = {}): Promise<void> {
    await this.shot(page, step);
    if (axe) await this.checkA11y(page, `${step} (${new URL(page.url()).pathname})`);
  }

  /** A screenshot of the last page opened, for a test that has failed. */
  async shotAfterFailure(): Promise<void> {
    if (this.lastPage && !this.lastPage.isClosed()) await this.shot(this.lastPage, "failed").catch(() => undefined);
  }

  async close(): Promise<void> {
    await this.browser?.close();
    await this.app?.close();
    this.db?.$client.close();
    fs.rmSync(this.dbDir, { recursive: true, force: true });
  }
}

/** The text of an element with runs of white space made one space. */
export async function textOf(locator: Locator): Promise<string> {
  return ((await locator.textContent()) ?? "").replace(/\s+/g, " ").trim();
}

/** Presses Tab until the element has focus (keyboard-only flows); fails after `limit` presses. */
export async function tabTo(page: Page, target: Locator, limit = 80, key: "Tab" | "Shift+Tab" = "Tab"): Promise<void> {
  for (let i = 0; i < limit; i += 1) {
    if (await target.evaluate((el) => el === document.activeElement).catch(() => false)) return;
    await page.keyboard.press(key);
  }
  throw new Error(`Focus did not reach ${target} within ${limit} presses of ${key}`);
}
