// The client's one data layer: every answer checked against its shared schema, every feature's query keys
// under its family, and one filter module whose URL state covers single quarters and ranges.
import { QueryClientProvider, type QueryClient } from "@tanstack/react-query";
import { cleanup, renderHook, waitFor } from "@testing-library/react";
import type { ReactNode } from "react";
import { MemoryRouter, useLocation } from "react-router";
import { afterEach, describe, expect, it, vi } from "vitest";
import { attemptListAnswerSchema, optionsAnswerSchema } from "../../shared/schemas/insight";
import { ApiError } from "../../src/api/http";
import { dataVersionQuery, figureQueryFamilies } from "../../src/app/figureQueries";
import { createQueryClient } from "../../src/app/queryClient";
import { attemptQueries } from "../../src/features/attempts/queries";
import { authQueries } from "../../src/features/auth/queries";
import { equipmentQueries } from "../../src/features/equipment/queries";
import { techniqueErrorQueries } from "../../src/features/techniqueErrors/queries";
import { importQueries } from "../../src/features/imports/queries";
import { insightQueries } from "../../src/features/insight/queries";
import { filterState, useInsightFilters } from "../../src/features/insight/useInsightFilters";
import { instructorQueries } from "../../src/features/instructors/queries";
import { outboxQueries } from "../../src/features/outbox/queries";
import { reportQueries } from "../../src/features/report/queries";
import { settingsQueries } from "../../src/features/settings/queries";
import { systemQueries } from "../../src/features/system/queries";
import { actionQueries } from "../../src/features/actions/queries";
import { trackerQueries } from "../../src/features/tracker/queries";
import { siteQueries } from "../../src/features/sites/queries";
import { userQueries } from "../../src/features/users/queries";
import { answer, fakeServer } from "./testServer";

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const wrongShape = { status: 200, body: { figures: "not these" } };

async function failureOf(queryClient: QueryClient, options: Parameters<QueryClient["fetchQuery"]>[0]): Promise<unknown> {
  try {
    await queryClient.fetchQuery({ ...options, retry: false });
  } catch (error) {
    return error;
  }
  return null;
}

describe("answers are checked against their shared schemas", () => {
  const checked = [
    {
      name: "error analysis",
      options: techniqueErrorQueries.analysis({ quarter: "2026-Q3", error: "too_shallow" }),
      path: "/api/insight/errors?quarter=2026-Q3&error=too_shallow",
    },
    { name: "equipment", options: equipmentQueries.report({ from: "2025-Q4", to: "2026-Q3" }), path: "/api/equipment?from=2025-Q4&to=2026-Q3" },
    {
      name: "attempt list",
      options: attemptQueries.list({ quarter: "2026-Q3", page: 2, pageSize: 50 }),
      path: "/api/attempts?quarter=2026-Q3&page=2&pageSize=50",
    },
    { name: "attempt", options: attemptQueries.detail("A 1"), path: "/api/attempts/A%201" },
    { name: "policy settings", options: settingsQueries.policy(), path: "/api/settings/policy" },
    { name: "policy versions", options: settingsQueries.versions(), path: "/api/settings/policy/versions" },
    { name: "filter options", options: insightQueries.options(), path: "/api/insight/options" },
    { name: "data version", options: dataVersionQuery.current(), path: "/api/data-version" },
    { name: "session", options: authQueries.me(), path: "/api/me" },
    { name: "import formats", options: importQueries.formats(), path: "/api/imports/formats" },
    { name: "import presets", options: importQueries.presets("classes"), path: "/api/imports/presets?kind=classes" },
    { name: "import batch", options: importQueries.batch(3), path: "/api/imports/batches/3" },
    { name: "import job", options: importQueries.job("j1"), path: "/api/imports/jobs/j1" },
    { name: "users", options: userQueries.list(), path: "/api/users" },
    { name: "sites", options: siteQueries.list(), path: "/api/sites" },
    { name: "instructors", options: instructorQueries.list(), path: "/api/instructors" },
  ];

  it.each(checked)("refuses an answer of the wrong shape: $name", async ({ options, path }) => {
    const server = fakeServer({ [`GET ${path}`]: wrongShape });
    const error = await failureOf(createQueryClient(), options as Parameters<QueryClient["fetchQuery"]>[0]);
    expect(server.requests.map((r) => r.path)).toEqual([path]);
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).code).toBe("unexpected_answer");
  });

  it("passes an answer of the right shape through", async () => {
    const noAttempts = { page: 1, pageSize: 50, total: 0, attempts: [] };
    fakeServer({ "GET /api/attempts?quarter=2026-Q3": answer(attemptListAnswerSchema, noAttempts) });
    expect(await createQueryClient().fetchQuery(attemptQueries.list({ quarter: "2026-Q3" }))).toEqual(noAttempts);
  });
});

describe("query keys", () => {
  // Every key a feature builds starts with its family's all(), so invalidating the family reaches it.
  const built = [
    { family: attemptQueries.all(), keys: [attemptQueries.list({}).queryKey, attemptQueries.detail("A1").queryKey] },
    { family: authQueries.all(), keys: [authQueries.me().queryKey] },
    { family: equipmentQueries.all(), keys: [equipmentQueries.report({}).queryKey] },
    { family: techniqueErrorQueries.all(), keys: [techniqueErrorQueries.analysis({}).queryKey] },
    {
      family: importQueries.all(),
      keys: [
        importQueries.formats().queryKey,
        importQueries.presets("classes").queryKey,
        importQueries.history().queryKey,
        importQueries.batch(1).queryKey,
        importQueries.job("j").queryKey,
      ],
    },
    {
      family: insightQueries.all(),
      keys: [
        insightQueries.options().queryKey,
        insightQueries.overview({}).queryKey,
        insightQueries.standing({}).queryKey,
        insightQueries.instructors({}).queryKey,
        insightQueries.instructor("1", {}).queryKey,
        insightQueries.classDetail("C1").queryKey,
        insightQueries.classAttempts("C1", "2026-Q3").queryKey,
      ],
    },
    { family: instructorQueries.all(), keys: [instructorQueries.list().queryKey] },
    { family: outboxQueries.all(), keys: [outboxQueries.list().queryKey] },
    {
      family: reportQueries.all(),
      keys: [
        reportQueries.preview("2026-Q3").queryKey,
        reportQueries.versions("2026").queryKey,
        reportQueries.versionData(1).queryKey,
        reportQueries.notes("2026-Q3").queryKey,
        reportQueries.sends().queryKey,
        reportQueries.funders().queryKey,
      ],
    },
    { family: settingsQueries.all(), keys: [settingsQueries.policy().queryKey, settingsQueries.versions().queryKey] },
    { family: siteQueries.all(), keys: [siteQueries.list().queryKey] },
    { family: userQueries.all(), keys: [userQueries.list().queryKey] },
    { family: systemQueries.all(), keys: [systemQueries.report().queryKey] },
    { family: actionQueries.all(), keys: [actionQueries.list().queryKey, actionQueries.detail(1).queryKey, actionQueries.marks({}).queryKey] },
    { family: trackerQueries.all(), keys: [trackerQueries.quarter("2026-Q3").queryKey] },
  ];

  it.each(built)("builds every key of $family under its family", ({ family, keys }) => {
    for (const key of keys) expect(key.slice(0, family.length)).toEqual(family);
  });

  it("gives every feature its own family", () => {
    const first = built.map(({ family }) => family[0]);
    expect(new Set(first).size).toBe(first.length);
  });

  it("invalidates the families whose answers a write of figures changes", () => {
    expect(figureQueryFamilies.map((key) => key[0])).toEqual([
      "insight",
      "errors",
      "attempts",
      "equipment",
      "report",
      "learners",
      "imports",
      "instructors",
      "system",
      "actions",
      "tracker",
      "alerts",
    ]);
  });
});

const options = optionsAnswerSchema.parse({
  quarters: ["2026-Q3", "2026-Q2", "2026-Q1", "2025-Q4", "2025-Q3"],
  sites: [{ id: 1, code: "WRM", name: "Wrenmoor Learning Centre" }],
  patientTypes: ["infant", "child", "adult"],
  feedbackModes: ["live", "hidden"],
  errors: [],
  instructors: [
    { id: 1, code: "IN01", name: "Ada Example", siteId: 1 },
    { id: 2, code: "IN02", name: "Bo Example", siteId: 1 },
  ],
  manikins: [],
});
const optional = ["site", "patientType", "feedback", "instructor", "manikin"] as const;
const state = (search: string, ranges = false) => filterState(options, new URLSearchParams(search), optional, { ranges })!;

describe("one filter module for single quarters and ranges", () => {
  it("asks the API for the quarter in the address, or the latest one", () => {
    expect(state("quarter=2026-Q2").api).toEqual({ quarter: "2026-Q2" });
    expect(state("").api).toEqual({ quarter: "2026-Q3" });
    expect(state("").period).toBe("2026-Q3");
  });

  // Quarters arrive newest first: "last 4" runs from the fourth newest to the newest, "all" from the oldest.
  it("turns the ranges into from/to on pages that offer them", () => {
    expect(state("quarter=last-4", true)).toMatchObject({
      period: "last-4",
      quarter: "2026-Q3",
      unknownQuarter: null,
      api: { from: "2025-Q4", to: "2026-Q3" },
    });
    expect(state("quarter=all", true).api).toEqual({ from: "2025-Q3", to: "2026-Q3" });
    expect(state("", true).definitions[0].options.map((o) => o.value)).toEqual([...options.quarters, "last-4", "all"]);
  });

  it("treats a range as unknown where only single quarters are offered", () => {
    const single = state("quarter=last-4");
    expect(single.definitions[0].options.map((o) => o.value)).toEqual(options.quarters);
    expect(single).toMatchObject({ unknownQuarter: "last-4", quarter: "2026-Q3", api: { quarter: "2026-Q3" } });
  });

  it("offers all quarters only when there are more than four", () => {
    const four = filterState({ ...options, quarters: options.quarters.slice(0, 4) }, new URLSearchParams(), optional, { ranges: true })!;
    expect(four.definitions[0].options.map((o) => o.value)).toEqual(["2026-Q3", "2026-Q2", "2026-Q1", "2025-Q4", "last-4"]);
  });

  it("maps the URL's names to the API's and says when other filters narrow the view", () => {
    const narrowed = state("quarter=2026-Q1&patient=infant&site=WRM&feedback=live&instructor=IN02&manikin=NONE");
    expect(narrowed.api).toEqual({ quarter: "2026-Q1", profile: "infant", site: "WRM", feedback: "live", instructor: "IN02" });
    expect(narrowed.narrowed).toBe(true);
    expect(state("quarter=2026-Q1").narrowed).toBe(false);
  });

  it("writes the period shown into the address, keeping a range", async () => {
    fakeServer({ "GET /api/insight/options": answer(optionsAnswerSchema, options) });
    const queryClient = createQueryClient();
    const at = (url: string) =>
      function Wrapper({ children }: { children: ReactNode }) {
        return (
          <QueryClientProvider client={queryClient}>
            <MemoryRouter initialEntries={[url]}>{children}</MemoryRouter>
          </QueryClientProvider>
        );
      };
    const latest = renderHook(() => ({ filters: useInsightFilters(["site"], { ranges: true }), location: useLocation() }), { wrapper: at("/errors?site=WRM") });
    await waitFor(() => expect(latest.result.current.location.search).toBe("?site=WRM&quarter=2026-Q3"));
    const range = renderHook(() => ({ filters: useInsightFilters(["site"], { ranges: true }), location: useLocation() }), {
      wrapper: at("/errors?quarter=all"),
    });
    await waitFor(() => expect(range.result.current.filters.state?.api).toEqual({ from: "2025-Q3", to: "2026-Q3" }));
    expect(range.result.current.location.search).toBe("?quarter=all");
  });
});
