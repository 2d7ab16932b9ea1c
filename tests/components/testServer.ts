// A stand-in for the server's HTTP answers in component tests, built on msw: a table of "METHOD /path" →
// answer, served by a request handler, with every request recorded. tests/components/setup.ts starts the
// one msw server for the component tests and resets it after each test.
import { http, HttpResponse } from "msw";
import { setupServer } from "msw/node";
import { z } from "zod";
import { apiErrorCodes, signInFirstMessage } from "../../shared/errorCodes";
import { sessionAnswerSchema } from "../../shared/schemas/auth";

export interface FakeAnswer {
  status: number;
  body?: unknown;
}

export interface RecordedRequest {
  method: string;
  /** The path with its query string as the client wrote it ("/api/attempts?quarter=2026-Q3"). */
  path: string;
  /** Header names in lower case, as HTTP has them. */
  headers: Record<string, string>;
  /** The JSON body, parsed; undefined for a request without one. */
  body: unknown;
}

/** Keys are "METHOD /path?query": the query is part of the match, so a test states exactly what is asked. */
/** A route answers at once, or through a function of the request that may hold its answer back (a promise). */
export type FakeRoutes = Record<string, FakeAnswer | ((request: RecordedRequest) => FakeAnswer | Promise<FakeAnswer>)>;

/** What the server answers for a route it does not have; tests/api/fakeServerAgreement.test.ts compares. */
export const unknownRoute: FakeAnswer = { status: 404, body: { error: { code: apiErrorCodes.notFound, message: "Not found" } } };

/** What the server answers a signed-out request (server/errors.ts `unauthorized`); tests/api/fakeServerAgreement.test.ts compares. */
export const signedOut: FakeAnswer = { status: 401, body: { error: { code: apiErrorCodes.unauthorized, message: signInFirstMessage } } };

function toResponse(answer: FakeAnswer): Response {
  return new HttpResponse(answer.body === undefined ? null : JSON.stringify(answer.body), {
    status: answer.status,
    headers: { "content-type": "application/json" },
  });
}

/** The API's address: in jsdom the client's "/api/..." resolves against the page's; a node test has no page. */
export const fakeApiOrigin = typeof location === "undefined" ? "http://fake.test" : location.origin;
const apiPaths = `${fakeApiOrigin}/api/*`;

/**
 * The one msw server of the component tests. Its lasting handler answers any API route no test listed the way
 * the server answers an unknown route, so a component meets only answers the real server can give.
 */
export const componentServer = setupServer(http.all(apiPaths, () => toResponse(unknownRoute)));

async function record(request: Request): Promise<RecordedRequest> {
  const url = new URL(request.url);
  const text = await request.clone().text();
  let body: unknown = undefined;
  if (text) {
    try {
      body = JSON.parse(text);
    } catch {
      body = text;
    }
  }
  return { method: request.method.toUpperCase(), path: url.pathname + url.search, headers: Object.fromEntries(request.headers), body };
}

/**
 * Serves the routes for the rest of the test (replacing any earlier fakeServer of the same test) and records
 * every API request, listed or not. A route not in the table gets the server's not-found answer.
 */
export function fakeServer(routes: FakeRoutes) {
  const requests: RecordedRequest[] = [];
  componentServer.resetHandlers();
  componentServer.use(
    http.all(apiPaths, async ({ request }) => {
      const recorded = await record(request);
      requests.push(recorded);
      const route = routes[`${recorded.method} ${recorded.path}`];
      if (route === undefined) return undefined; // falls through to the not-found handler
      return toResponse(typeof route === "function" ? await route(recorded) : route);
    }),
  );
  return { requests };
}

/**
 * A 200 answer whose body must fit the schema the client reads it with (shared/schemas). The fixture is
 * checked when the test builds it, so a fixture that drifted from the server's answer shape fails the test
 * with the fields that no longer fit, not with a page that quietly shows an error. The body is served as
 * written, not as parsed: the client does its own parsing, as it does with the real server.
 */
export function answer<Schema extends z.ZodType>(schema: Schema, body: z.input<Schema>, status = 200): FakeAnswer {
  const checked = schema.safeParse(body);
  if (!checked.success) throw new Error(`The fixture does not fit the answer schema:\n${z.prettifyError(checked.error)}`);
  return { status, body };
}

export function sessionFor(role: "coordinator" | "quality_lead" | "instructor" | "funder"): FakeAnswer {
  return answer(sessionAnswerSchema, {
    user: { id: 7, email: "robin@example.org", displayName: "Robin Example", role, instructorId: null, siteId: null, lengthUnit: "mm" },
    csrfToken: "token-1",
  });
}
