// A stand-in for the server's HTTP answers in component tests: a table of "METHOD /path" → answer, served
// through a stubbed fetch, with every request recorded.
import { vi } from "vitest";
import { apiErrorCodes, signInFirstMessage } from "../../shared/errorCodes";

export interface FakeAnswer {
  status: number;
  body?: unknown;
}

export type FakeRoutes = Record<string, FakeAnswer | ((init: RequestInit | undefined) => FakeAnswer)>;

export interface RecordedRequest {
  method: string;
  path: string;
  headers: Record<string, string>;
  body: unknown;
}

export function fakeServer(routes: FakeRoutes) {
  const requests: RecordedRequest[] = [];
  const fetchStub = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const path = typeof input === "string" ? input : input instanceof URL ? input.pathname : input.url;
    const method = (init?.method ?? "GET").toUpperCase();
    requests.push({
      method,
      path,
      headers: (init?.headers ?? {}) as Record<string, string>,
      body: typeof init?.body === "string" ? JSON.parse(init.body) : undefined,
    });
    const route = routes[`${method} ${path}`];
    const answer = typeof route === "function" ? route(init) : (route ?? { status: 404, body: { error: { code: apiErrorCodes.notFound, message: "Not found" } } });
    return new Response(answer.body === undefined ? null : JSON.stringify(answer.body), {
      status: answer.status,
      headers: { "content-type": "application/json" },
    });
  });
  vi.stubGlobal("fetch", fetchStub);
  return { requests };
}

/** What the server answers a signed-out request (server/errors.ts `unauthorized`); tests/api/fakeServerAgreement.test.ts compares. */
export const signedOut: FakeAnswer = { status: 401, body: { error: { code: apiErrorCodes.unauthorized, message: signInFirstMessage } } };

export function sessionFor(role: "coordinator" | "quality_lead" | "instructor" | "funder"): FakeAnswer {
  return {
    status: 200,
    body: {
      user: { id: 7, email: "robin@example.org", displayName: "Robin Example", role, instructorId: null, siteId: null, lengthUnit: "mm" },
      csrfToken: "token-1",
    },
  };
}
