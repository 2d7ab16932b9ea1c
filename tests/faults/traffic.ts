// Browser-like load on a running server for the fault tests: a signed-in client over real HTTP and a loop of
// reads and writes that runs until told to stop.
import type { AddressInfo } from "node:net";
import { expect } from "vitest";
import type { Db } from "../../server/db/client";
import { makeTestApp, TEST_PASSWORD } from "../helpers/testApp";

/** A signed-in client: cookies kept by hand, the CSRF header on writes. */
export async function signedInClient(base: string, email: string) {
  const cookies = new Map<string, string>();
  let token = "";
  const call = async (method: string, url: string, body?: unknown) => {
    const res = await fetch(base + url, {
      method,
      headers: {
        cookie: [...cookies].map(([k, v]) => `${k}=${v}`).join("; "),
        ...(body !== undefined ? { "content-type": "application/json" } : {}),
        ...(method !== "GET" ? { "x-csrf-token": token } : {}),
      },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(";");
      cookies.set(pair.slice(0, pair.indexOf("=")), pair.slice(pair.indexOf("=") + 1));
    }
    const text = await res.text();
    const json = text && res.headers.get("content-type")?.includes("json") ? JSON.parse(text) : null;
    if (json?.csrfToken) token = json.csrfToken;
    return { status: res.status, json };
  };
  await call("GET", "/api/auth/csrf");
  const login = await call("POST", "/api/auth/login", { email, password: TEST_PASSWORD });
  expect(login.status).toBe(200);
  return call;
}

/** Reads and writes as the coordinator of seedPeople until `stop` says so; returns every answer's status. */
export async function traffic(base: string, stop: () => boolean, sitePrefix = "BK") {
  const call = await signedInClient(base, "coord@test.example");
  const statuses: number[] = [];
  let n = 0;
  while (!stop()) {
    n++;
    statuses.push((await call("GET", "/api/insight/overview?quarter=2026-Q2")).status);
    statuses.push((await call("GET", `/api/attempts?quarter=2026-Q1&page=${(n % 5) + 1}`)).status);
    statuses.push((await call("PUT", "/api/reports/2026-Q2/notes", { actions: `Depth drill, round ${n}` })).status);
    statuses.push((await call("POST", "/api/sites", { code: `${sitePrefix}${n}`, name: `Traffic site ${n}` })).status);
  }
  return statuses;
}

/** The test app on `db`, listening on a free port of 127.0.0.1. */
export async function serve(db: Db): Promise<{ base: string; close: () => Promise<void> }> {
  const server = makeTestApp(db).listen(0, "127.0.0.1");
  await new Promise((resolve) => server.once("listening", resolve));
  return {
    base: `http://127.0.0.1:${(server.address() as AddressInfo).port}`,
    close: () => new Promise((resolve) => server.close(() => resolve())),
  };
}
