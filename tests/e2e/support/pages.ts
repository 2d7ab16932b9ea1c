// What the journeys do with a page besides clicking: sign in through the form, ask the API with the page's own
// cookies, read an element's text, and reach an element with the keyboard.
import type { Locator, Page } from "@playwright/test";

export interface ApiAnswer<T> {
  status: number;
  body: T;
}

/** Signs in through the form and waits until the app has left the sign-in page. */
export async function signIn(page: Page, account: { email: string; password: string }): Promise<void> {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail address").fill(account.email);
  await page.getByLabel("Password").fill(account.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
}

/** GET an API path with the page's cookies (the signed-in user). */
export async function api<T = unknown>(page: Page, pathname: string): Promise<ApiAnswer<T>> {
  const response = await page.request.get(pathname);
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
export async function apiPost<T = unknown>(page: Page, pathname: string, body: object = {}): Promise<ApiAnswer<T>> {
  const me = await api<{ csrfToken: string }>(page, "/api/me");
  const response = await page.request.post(pathname, { data: body, headers: { "x-csrf-token": me.body.csrfToken } });
  const text = await response.text();
  return { status: response.status(), body: (text ? JSON.parse(text) : null) as T };
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
