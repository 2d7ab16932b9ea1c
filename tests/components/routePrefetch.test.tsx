// A filtered page's requests start when the router navigates to it: the filter options and the page's answer
// go out side by side. The options answer is held back until the answer's request has been seen, so a page
// that asked for its answer only after the options had arrived would never get its options.
import { cleanup, screen, waitFor } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { optionsAnswerSchema, techniqueErrorsAnswerSchema } from "../../shared/schemas/insight";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor, signedOut, type FakeAnswer, type FakeRoutes } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });

const waiting: ReturnType<typeof setInterval>[] = [];

afterEach(() => {
  waiting.splice(0).forEach(clearInterval);
  cleanup();
});

const options = optionsAnswerSchema.parse({
  quarters: ["2026-Q3", "2026-Q2"],
  sites: [{ id: 1, code: "WRM", name: "Wrenmoor Learning Centre" }],
  patientTypes: ["adult"],
  feedbackModes: ["live"],
  errors: [],
  instructors: [],
  manikins: [],
});

const noAttempts = techniqueErrorsAnswerSchema.parse({
  period: { from: "2026-Q3", to: "2026-Q3", quarters: ["2026-Q3"] },
  pareto: { attempts: 0, rows: [], suppressed: false },
  selected: null,
});

/** The fake server with some answers held back; `paths` lists every API request in the order it was made. */
function heldServer(answers: Record<string, FakeAnswer | (() => Promise<FakeAnswer>)>) {
  // looked up at each request, so a test may add a held answer that refers to the server after starting it
  const routes = new Proxy({} as FakeRoutes, { get: (_, key) => (typeof key === "string" && key.startsWith("GET ") ? answers[key.slice(4)] : undefined) });
  const { requests } = fakeServer(routes);
  return {
    get paths() {
      return requests.map((request) => request.path);
    },
  };
}

/** The options answer, sent only once `path` has been asked for. */
function optionsAfter(server: { paths: string[] }, path: string) {
  return () =>
    new Promise<FakeAnswer>((resolve) => {
      const check = setInterval(() => {
        if (!server.paths.includes(path)) return;
        clearInterval(check);
        resolve(answer(optionsAnswerSchema, options));
      }, 10);
      waiting.push(check);
    });
}

describe("requests started at navigation", () => {
  it("asks for the overview while the filter options are still on their way", async () => {
    const answers: Record<string, FakeAnswer | (() => Promise<FakeAnswer>)> = { "/api/me": sessionFor("coordinator") };
    const server = heldServer(answers);
    answers["/api/insight/options"] = optionsAfter(server, "/api/insight/overview?quarter=2026-Q3");
    renderApp("/overview?quarter=2026-Q3");
    await waitFor(() => expect(server.paths).toContain("/api/insight/overview?quarter=2026-Q3"));
    expect(server.paths).toContain("/api/insight/options");
    // the page itself then gets its options and draws its filters
    expect(await screen.findByRole("heading", { name: "Network overview" })).toBeTruthy();
  });

  it("shows the technique errors from the answer asked for at navigation, without asking again", async () => {
    const errorsPath = "/api/insight/errors?quarter=2026-Q3&site=WRM";
    const answers: Record<string, FakeAnswer | (() => Promise<FakeAnswer>)> = {
      "/api/me": sessionFor("coordinator"),
      [errorsPath]: answer(techniqueErrorsAnswerSchema, noAttempts),
    };
    const server = heldServer(answers);
    answers["/api/insight/options"] = optionsAfter(server, errorsPath);
    renderApp("/errors?quarter=2026-Q3&site=WRM");
    expect(await screen.findByText("No attempts match these filters")).toBeTruthy();
    expect(server.paths.filter((path) => path.startsWith("/api/insight/errors"))).toEqual([errorsPath]);
    expect(server.paths.filter((path) => path === "/api/insight/options")).toHaveLength(1);
  });

  it("still sends a signed-out visitor to sign in, back to the page asked for", async () => {
    heldServer({ "/api/me": signedOut, "/api/insight/options": signedOut, "/api/insight/overview?quarter=2026-Q3": signedOut });
    const { router } = renderApp("/overview?quarter=2026-Q3");
    expect(await screen.findByRole("heading", { name: "Sign in" })).toBeTruthy();
    expect(new URLSearchParams(router.state.location.search).get("next")).toBe("/overview?quarter=2026-Q3");
  });

  it("asks nothing for a page the signed-in role may not open", async () => {
    const server = heldServer({ "/api/me": sessionFor("funder") });
    const { router } = renderApp("/account");
    await screen.findByRole("navigation", { name: "Main" });
    await router.navigate("/instructors?quarter=2026-Q3");
    expect(await screen.findByRole("heading", { name: "Not available for your role" })).toBeTruthy();
    expect(server.paths.filter((path) => path.startsWith("/api/insight/"))).toEqual([]);
  });
});
