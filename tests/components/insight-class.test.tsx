// The class page: the log row, its attempts with links to each attempt, depth in the user's unit, and the
// "not found or not yours" answer an instructor gets for another instructor's class.
import { cleanup, configure, screen, within } from "@testing-library/react";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import {
  attemptListAnswerSchema,
  classDetailAnswerSchema,
  type AttemptListAnswer,
  type AttemptRow,
  type ClassDetailAnswer,
} from "../../shared/schemas/insight";
import { sessionAnswerSchema, type SessionAnswer } from "../../shared/schemas/auth";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor, type FakeAnswer } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 10_000 });

beforeAll(async () => {
  await import("../../src/features/insight/classes/ClassDetailPage");
}, 120_000);

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const detail: ClassDetailAnswer = {
  class: {
    id: "CL-0276",
    date: "2026-10-17",
    quarter: "2026-Q4",
    course: "adult",
    site: { id: 1, code: "WRM" },
    instructor: { id: 3, code: "IN03", name: "Ilse Pendrake" },
    learners: 6,
    passed: 5,
    manikins: ["WRM-A01", "WRM-A03"],
    lungsReplaced: 0,
    mouthpiecesCleaned: 6,
    batteriesReplaced: null,
  },
  passRate: { successes: 1, n: 2, rate: 0.5, low: 0.0945, high: 0.9055, suppressed: false },
  attempts: [
    {
      id: "AT-1",
      learner: "L-TBMZV",
      startedAt: "2026-10-17T09:09:00Z",
      profile: "adult",
      feedback: "live",
      score: 91.15,
      passed: true,
      instructorResult: "pass",
      errors: [],
      hasStream: true,
    },
    {
      id: "AT-2",
      learner: "L-5WVLM",
      startedAt: "2026-10-17T09:11:29Z",
      profile: "adult",
      feedback: "hidden",
      score: 70.6667,
      passed: false,
      instructorResult: null,
      errors: ["too_shallow", "long_pause"],
      hasStream: false,
    },
  ],
};

const metrics = (depthMm: number, rateCpm: number) => ({
  durationS: 120,
  compressions: 220,
  rateCpm,
  depthMm,
  depthOkPct: 80,
  tooShallowPct: 20,
  tooDeepPct: 0,
  rateOkPct: 90,
  tooSlowPct: 5,
  tooFastPct: 5,
  recoilOkPct: 100,
  handsOnPct: 95,
  longestPauseS: 3,
  pauses: 1,
  pausesOver10s: 0,
});
const row = (id: string, depthMm: number, rateCpm: number): AttemptRow => ({
  id,
  classId: "CL-0276",
  learner: "L",
  startedAt: "2026-10-17T09:09:00Z",
  quarter: "2026-Q4",
  profile: "adult",
  feedback: "live",
  site: { id: 1, code: "WRM" },
  instructor: { id: 3, code: "IN03" },
  manikin: null,
  metrics: metrics(depthMm, rateCpm),
  score: 90,
  passed: true,
  instructorResult: "pass",
  errors: [],
  policyVersion: 1,
  source: "summary",
  hasStream: false,
});
const measured: AttemptListAnswer = { page: 1, pageSize: 200, total: 2, attempts: [row("AT-1", 52.4, 112.4), row("AT-2", 44.45, 104)] };

function sessionIn(unit: "mm" | "cm" | "in"): FakeAnswer {
  const body = sessionFor("coordinator").body as SessionAnswer;
  return answer(sessionAnswerSchema, { ...body, user: { ...body.user, lengthUnit: unit } });
}

describe("class page", () => {
  it("shows the class log and every attempt with its result, errors in words and a link to the attempt", async () => {
    fakeServer({
      "GET /api/me": sessionIn("mm"),
      "GET /api/classes/CL-0276": answer(classDetailAnswerSchema, detail),
      "GET /api/attempts?class=CL-0276&quarter=2026-Q4&pageSize=200": answer(attemptListAnswerSchema, measured),
    });
    renderApp("/classes/CL-0276");
    expect(await screen.findByRole("heading", { name: "Class CL-0276", level: 1 })).toBeTruthy();
    const log = screen.getByRole("heading", { name: "Class log" }).closest("section")!;
    expect(log.textContent).toContain("5 of 6 (83.3 %)");
    expect(log.textContent).toContain("50.0 % (95 % interval 9.5–90.6 %)");
    expect(log.textContent).toContain("WRM-A01, WRM-A03");
    expect(within(log).getByText("Batteries replaced").nextSibling?.textContent).toBe("not recorded");

    const table = screen.getByRole("table", { name: "Attempts" });
    // the attempt's back link returns to this class
    expect(within(table).getByRole("link", { name: "AT-1" }).getAttribute("href")).toBe("/attempts/AT-1?from=%2Fclasses%2FCL-0276");
    expect(screen.getByRole("link", { name: "Open this class’s attempts in the attempts list" }).getAttribute("href")).toBe(
      "/attempts?quarter=2026-Q4&class=CL-0276",
    );
    const second = within(table).getByRole("link", { name: "AT-2" }).closest("tr")!;
    expect(second.textContent).toContain("Not passed");
    expect(second.textContent).toContain("not recorded");
    expect(second.textContent).toContain("Too shallow, Long interruption");
    expect(second.textContent).toContain("70.7");
  });

  it("shows depth in the signed-in user's unit", async () => {
    fakeServer({
      "GET /api/me": sessionIn("in"),
      "GET /api/classes/CL-0276": answer(classDetailAnswerSchema, detail),
      "GET /api/attempts?class=CL-0276&quarter=2026-Q4&pageSize=200": answer(attemptListAnswerSchema, measured),
    });
    renderApp("/classes/CL-0276");
    const table = await screen.findByRole("table", { name: "Attempts" });
    expect(within(table).getByRole("button", { name: "Depth (in)" })).toBeTruthy();
    // 44.45 mm = 1.75 in exactly (1 in = 25.4 mm, international yard and pound agreement, 1959)
    expect(await within(table).findByText("1.75 in")).toBeTruthy();
    expect(within(table).getByText("2.06 in")).toBeTruthy();
  });

  it("tells an instructor a class is not found or not theirs when the server answers 404", async () => {
    fakeServer({
      "GET /api/me": sessionFor("instructor"),
      "GET /api/classes/CL-0001": { status: 404, body: { error: { code: "not_found", message: "The class was not found." } } },
    });
    renderApp("/classes/CL-0001");
    expect(await screen.findByRole("heading", { name: "Class not found or not yours", level: 1 })).toBeTruthy();
    expect(screen.getByText(/taught by another instructor\. Instructors can open their own classes only\./)).toBeTruthy();
    expect(screen.getByRole("link", { name: "Go to your classes" }).getAttribute("href")).toBe("/my-standing");
  });
});
