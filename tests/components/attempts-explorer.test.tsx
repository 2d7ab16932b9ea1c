// The attempt list through the real router with the server's answers stubbed at the HTTP boundary: every
// choice (filters, search, sort, page, columns) lives in the URL and reaches the API; the column chooser;
// headers with aria-sort; attempt links and the CSV that carry the list's filters; the attempt page's back
// link and class link.
import { cleanup, configure, fireEvent, screen, waitFor, within } from "@testing-library/react";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import {
  attemptDetailAnswerSchema,
  attemptListAnswerSchema,
  optionsAnswerSchema,
  type AttemptDetailAnswer,
  type AttemptListAnswer,
  type AttemptRow,
  type OptionsAnswer,
} from "../../shared/schemas/insight";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor, type FakeAnswer, type FakeRoutes } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 10_000 });

beforeAll(async () => {
  await import("../../src/features/attempts/AttemptsPage");
  await import("../../src/features/attempts/AttemptDetailPage");
}, 120_000);

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const options: OptionsAnswer = {
  quarters: ["2026-Q4", "2026-Q3"],
  sites: [{ id: 1, code: "WRM", name: "Wrenmoor Learning Centre" }],
  patientTypes: ["infant", "adult"],
  feedbackModes: ["live", "hidden"],
  errors: [
    { name: "too_shallow", label: "Compressions mostly not deep enough" },
    { name: "long_pause", label: "An interruption longer than allowed" },
  ],
  instructors: [
    { id: 3, code: "IN03", name: "Ilse Pendrake", siteId: 1 },
    { id: 4, code: "IN04", name: "Oren Talby", siteId: 1 },
  ],
  manikins: [],
};

const row = (id: string, learner: string, score: number, errors: AttemptRow["errors"]): AttemptRow => ({
  id,
  classId: "CL-0276",
  learner,
  startedAt: "2026-10-17T09:09:00Z",
  quarter: "2026-Q4",
  profile: "adult",
  feedback: "live",
  site: { id: 1, code: "WRM" },
  instructor: { id: 3, code: "IN03" },
  manikin: null,
  metrics: {
    durationS: 120,
    compressions: 220,
    rateCpm: 112,
    depthMm: 52,
    depthOkPct: 81.4,
    tooShallowPct: 18.6,
    tooDeepPct: 0,
    rateOkPct: 90,
    tooSlowPct: 5,
    tooFastPct: 5,
    recoilOkPct: 100,
    handsOnPct: 95,
    longestPauseS: 3,
    pauses: 1,
    pausesOver10s: 0,
  },
  score,
  passed: errors.length === 0,
  instructorResult: null,
  errors,
  policyVersion: 1,
  source: "summary",
  hasStream: false,
});

const listAnswer: AttemptListAnswer = {
  page: 2,
  pageSize: 50,
  total: 120,
  attempts: [row("AT-1", "L-TBMZV", 91, []), row("AT-2", "L-5WVLM", 70.6, ["too_shallow", "long_pause"])],
};

/** Answers every attempt-list request with the same page; the requests say what was asked. */
function serve(role: "quality_lead" | "instructor" = "quality_lead", extra: FakeRoutes = {}) {
  const routes: FakeRoutes = {
    "GET /api/me": sessionFor(role),
    "GET /api/insight/options": answer(optionsAnswerSchema, options),
    ...extra,
  };
  const list: FakeAnswer = answer(attemptListAnswerSchema, listAnswer);
  return fakeServer(new Proxy(routes, { get: (target, key: string) => target[key] ?? (key.startsWith("GET /api/attempts?") ? list : undefined) }));
}

function lastListQuery(requests: { path: string }[]): URLSearchParams {
  const paths = requests.map((r) => r.path).filter((p) => p.startsWith("/api/attempts?"));
  return new URLSearchParams(paths.at(-1)!.split("?")[1]);
}

const headers = (table: HTMLElement) =>
  within(table)
    .getAllByRole("columnheader")
    .map((th) => th.textContent);

describe("attempt list state in the URL", () => {
  it("asks the server for the filters, search, order and page in the address", async () => {
    const { requests } = serve();
    renderApp("/attempts?quarter=2026-Q4&error=too_shallow&stream=no&learner=L-5&learnerMatch=prefix&class=CL-0276&sort=score&dir=desc&page=2");
    const table = await screen.findByRole("table", { name: "Attempts" });
    const query = lastListQuery(requests);
    expect(Object.fromEntries(query)).toEqual({
      quarter: "2026-Q4",
      error: "too_shallow",
      stream: "no",
      class: "CL-0276",
      learner: "L-5",
      learnerMatch: "prefix",
      sort: "score",
      dir: "desc",
      page: "2",
      pageSize: "50",
    });
    expect(screen.getByText("Attempts 51–100 of 120, sorted by score, highest first")).toBeTruthy();
    expect(within(table).getByRole("columnheader", { name: "Score" }).getAttribute("aria-sort")).toBe("descending");
    expect(within(table).getByRole("columnheader", { name: "Started" }).getAttribute("aria-sort")).toBe("none");
    expect((screen.getByLabelText("Learner code (optional)") as HTMLInputElement).value).toBe("L-5");
    expect((screen.getByLabelText("Codes that start with this") as HTMLInputElement).checked).toBe(true);
  });

  it("sorts by a header click over the whole result and starts again at page 1", async () => {
    const { requests } = serve();
    const { router } = renderApp("/attempts?quarter=2026-Q4&page=2");
    const table = await screen.findByRole("table", { name: "Attempts" });
    expect(within(table).getByRole("columnheader", { name: "Started" }).getAttribute("aria-sort")).toBe("descending");
    fireEvent.click(within(table).getByRole("button", { name: "Learner" }));
    await waitFor(() => expect(new URLSearchParams(router.state.location.search).get("sort")).toBe("learner"));
    const params = new URLSearchParams(router.state.location.search);
    expect(params.get("dir")).toBe("asc");
    expect(params.get("page")).toBeNull();
    await waitFor(() => expect(lastListQuery(requests).get("sort")).toBe("learner"));
    expect(lastListQuery(requests).get("page")).toBe("1");
    fireEvent.click(within(await screen.findByRole("table", { name: "Attempts" })).getByRole("button", { name: "Learner" }));
    await waitFor(() => expect(new URLSearchParams(router.state.location.search).get("dir")).toBe("desc"));
  });

  it("writes a learner search into the address, and names a code it cannot search for", async () => {
    serve();
    const { router } = renderApp("/attempts?quarter=2026-Q4&page=3");
    await screen.findByRole("table", { name: "Attempts" });
    const learner = screen.getByLabelText("Learner code (optional)");
    fireEvent.change(learner, { target: { value: "Jane Doe" } });
    fireEvent.click(screen.getByRole("button", { name: "Search" }));
    expect(await screen.findByText(/Use a learner code of letters, digits/)).toBeTruthy();
    expect(new URLSearchParams(router.state.location.search).get("learner")).toBeNull();
    fireEvent.change(learner, { target: { value: " L-TB " } });
    fireEvent.click(screen.getByLabelText("Codes that start with this"));
    fireEvent.click(screen.getByRole("button", { name: "Search" }));
    await waitFor(() => expect(new URLSearchParams(router.state.location.search).get("learner")).toBe("L-TB"));
    const params = new URLSearchParams(router.state.location.search);
    expect(params.get("learnerMatch")).toBe("prefix");
    expect(params.get("page")).toBeNull();
  });

  it("links each attempt with the list's address, and exports the whole filtered result", async () => {
    serve();
    renderApp("/attempts?quarter=2026-Q4&error=too_shallow&sort=score&dir=asc");
    const table = await screen.findByRole("table", { name: "Attempts" });
    const href = within(table).getByRole("link", { name: "AT-2" }).getAttribute("href")!;
    expect(href.startsWith("/attempts/AT-2?")).toBe(true);
    expect(new URLSearchParams(href.split("?")[1]).get("from")).toBe("/attempts?quarter=2026-Q4&error=too_shallow&sort=score&dir=asc");
    const csv = screen.getByRole("link", { name: /Export CSV of all 120 attempts/ });
    expect(csv.getAttribute("href")).toBe("/api/attempts.csv?quarter=2026-Q4&error=too_shallow&sort=score&dir=asc");
    // the errors in short words, their full labels on hover; the first column is the attempt, a row header
    expect(within(table).getByText("Too shallow, Long interruption").getAttribute("title")).toBe(
      "Compressions mostly not deep enough; An interruption longer than allowed",
    );
    expect(
      within(table)
        .getAllByRole("rowheader")
        .map((th) => th.textContent),
    ).toEqual(["AT-1", "AT-2"]);
  });
});

describe("column chooser", () => {
  it("shows the default columns, adds and removes columns through the address, and goes back to the defaults", async () => {
    serve();
    const { router } = renderApp("/attempts?quarter=2026-Q4");
    const table = await screen.findByRole("table", { name: "Attempts" });
    expect(headers(table)).toEqual(["Attempt", "Started", "Learner", "Patient type", "Result", "Errors", "Score", "Depth on target (%)", "Rate on target (%)"]);
    const chooser = screen.getByRole("group", { name: "Columns to show beside the attempt" });
    expect(within(chooser).getAllByRole("checkbox")).toHaveLength(20);
    fireEvent.click(within(chooser).getByRole("checkbox", { name: "Site" }));
    await waitFor(() => expect(headers(screen.getByRole("table", { name: "Attempts" }))).toContain("Site"));
    expect(new URLSearchParams(router.state.location.search).get("cols")).toBe("startedAt,learner,site,profile,passed,errors,score,depthOk,rateOk");
    fireEvent.click(within(chooser).getByRole("checkbox", { name: "Learner" }));
    await waitFor(() => expect(headers(screen.getByRole("table", { name: "Attempts" }))).not.toContain("Learner"));
    fireEvent.click(screen.getByRole("button", { name: "Back to the default columns" }));
    await waitFor(() => expect(new URLSearchParams(router.state.location.search).get("cols")).toBeNull());
    expect(headers(screen.getByRole("table", { name: "Attempts" }))).toContain("Learner");
  });

  it("shows the columns a shared link names, in the list's order, ignoring unknown ones", async () => {
    serve();
    renderApp("/attempts?quarter=2026-Q4&cols=score,manikin,bogus,class");
    const table = await screen.findByRole("table", { name: "Attempts" });
    expect(headers(table)).toEqual(["Attempt", "Class", "Manikin", "Score"]);
    expect(within(table).getAllByRole("link", { name: "CL-0276" })[0].getAttribute("href")).toBe("/classes/CL-0276");
    expect(within(table).getAllByText("not recorded")).toHaveLength(2);
  });
});

describe("instructors", () => {
  it("open the attempt list of their own attempts from the navigation", async () => {
    serve("instructor");
    renderApp("/attempts?quarter=2026-Q4&error=too_shallow");
    expect(await screen.findByRole("table", { name: "Attempts" })).toBeTruthy();
    expect(screen.getByText(/Each attempt in your classes/)).toBeTruthy();
    expect(screen.getByRole("link", { name: "Attempts" })).toBeTruthy();
  });
});

const detail: AttemptDetailAnswer = {
  attempt: row("AT-2", "L-5WVLM", 70.6, ["too_shallow"]),
  scoring: null,
  placement: {
    quarter: "2026-Q4",
    profile: "adult",
    attempts: null,
    hidden: true,
    percentiles: { score: null, depthOkPct: null, rateOkPct: null, recoilOkPct: null, handsOnPct: null },
  },
  errorLabels: [],
  scoreHistory: [],
  stream: null,
};

describe("attempt page back link", () => {
  const open = (path: string, role: "quality_lead" | "instructor" = "quality_lead") => {
    fakeServer({ "GET /api/me": sessionFor(role), "GET /api/attempts/AT-2": answer(attemptDetailAnswerSchema, detail) });
    return renderApp(path);
  };

  it("returns to the list it was opened from, with its filters", async () => {
    const from = "/attempts?quarter=2026-Q4&error=too_shallow&sort=score&dir=asc&page=2";
    open(`/attempts/AT-2?${new URLSearchParams({ from })}`);
    const back = await screen.findByRole("link", { name: /Back to attempts/ });
    expect(back.getAttribute("href")).toBe(from);
  });

  it("returns to the class an instructor opened it from, and links the class", async () => {
    open("/attempts/AT-2?from=%2Fclasses%2FCL-0276", "instructor");
    const back = await screen.findByRole("link", { name: /Back to class CL-0276/ });
    expect(back.getAttribute("href")).toBe("/classes/CL-0276");
    await screen.findByRole("heading", { name: "Attempt AT-2", level: 1 });
    expect(screen.getByRole("link", { name: "CL-0276" }).getAttribute("href")).toBe("/classes/CL-0276");
  });

  it.each(["//evil.example/attempts", "https://evil.example/", "javascript:alert(1)", "/\\evil.example"])("never follows %s out of the app", async (from) => {
    open(`/attempts/AT-2?${new URLSearchParams({ from })}`, "instructor");
    const back = await screen.findByRole("link", { name: /Back to attempts/ });
    expect(back.getAttribute("href")).toBe("/attempts");
  });
});
