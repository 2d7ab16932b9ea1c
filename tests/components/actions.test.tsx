// The improvement-action form (shared schema messages, the payload it sends) and the action page (its
// evaluation in words, and what an instructor may not do there).
import { QueryClientProvider } from "@tanstack/react-query";
import { cleanup, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { actionDetailAnswerSchema, type ActionDetailAnswer, type ActionRow } from "../../shared/schemas/actions";
import { actionMonthlyAnswerSchema, type MonthlyRunChart } from "../../shared/schemas/runChart";
import { instructorListAnswerSchema, siteListAnswerSchema } from "../../shared/schemas/sites";
import { setCsrfToken } from "../../src/api/http";
import { createQueryClient } from "../../src/app/queryClient";
import { ActionForm } from "../../src/features/actions/ActionForm";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor } from "./testServer";
import { formatDay } from "../../src/lib/formatting";

vi.setConfig({ testTimeout: 20_000 });

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const directory = {
  "GET /api/sites": answer(siteListAnswerSchema, { sites: [{ id: 1, code: "NORTH", name: "Northfield Hall", active: true, instructors: 2, manikins: 1 }] }),
  "GET /api/instructors": answer(instructorListAnswerSchema, {
    instructors: [{ id: 4, code: "A1", name: "Instructor A1", siteId: 1, siteCode: "NORTH", active: true }],
  }),
};

const action: ActionRow = {
  id: 3,
  title: "Infant depth refresher",
  aim: "too_shallow",
  target: 20,
  siteId: 1,
  siteCode: "NORTH",
  instructorId: null,
  instructorCode: null,
  profile: "infant",
  startDate: "2026-02-15",
  owner: "Quality lead",
  status: "under_way",
  createdAt: "2026-02-01T10:00:00.000Z",
  updatedAt: "2026-02-01T10:00:00.000Z",
};

describe("the action form", () => {
  it("shows the shared schema's messages and sends nothing until the form is complete", async () => {
    const server = fakeServer({ ...directory, "POST /api/actions": { status: 201, body: { action } } });
    const onDone = vi.fn();
    setCsrfToken("token");
    render(
      <QueryClientProvider client={createQueryClient()}>
        <ActionForm onDone={onDone} onCancel={() => {}} today="2026-02-15" />
      </QueryClientProvider>,
    );
    fireEvent.click(screen.getByRole("button", { name: "Record action" }));
    // messages from shared/schemas/actions.ts
    expect(await screen.findByText("Say what the action is")).toBeTruthy();
    expect(screen.getByText("Choose the figure the action aims to move")).toBeTruthy();
    expect(screen.getByText("Enter the target as a percentage")).toBeTruthy();
    expect(server.requests.filter((r) => r.method === "POST")).toHaveLength(0);

    fireEvent.change(screen.getByLabelText("What is being done"), { target: { value: "Infant depth refresher" } });
    fireEvent.change(screen.getByLabelText("Aim"), { target: { value: "too_shallow" } });
    fireEvent.change(screen.getByLabelText("Target (%)"), { target: { value: "20" } });
    await screen.findByRole("option", { name: /NORTH · Northfield Hall/ });
    fireEvent.change(screen.getByLabelText(/^Site/), { target: { value: "1" } });
    fireEvent.change(screen.getByLabelText(/^Patient type/), { target: { value: "infant" } });
    fireEvent.change(screen.getByLabelText("Owner"), { target: { value: "Quality lead" } });
    fireEvent.change(screen.getByLabelText("Status"), { target: { value: "under_way" } });
    fireEvent.click(screen.getByRole("button", { name: "Record action" }));
    await waitFor(() => expect(onDone).toHaveBeenCalled());
    expect(server.requests.find((r) => r.method === "POST")?.body).toEqual({
      title: "Infant depth refresher",
      aim: "too_shallow",
      target: 20,
      siteId: 1,
      instructorId: null,
      profile: "infant",
      startDate: "2026-02-15",
      owner: "Quality lead",
      status: "under_way",
    });
  });

  it("clears the site when an instructor is chosen, so the scope names one of them", async () => {
    fakeServer(directory);
    setCsrfToken("token");
    render(
      <QueryClientProvider client={createQueryClient()}>
        <ActionForm action={action} onDone={() => {}} onCancel={() => {}} />
      </QueryClientProvider>,
    );
    await screen.findByRole("option", { name: /A1 · Instructor A1/ });
    expect((screen.getByLabelText(/^Site/) as HTMLSelectElement).value).toBe("1");
    fireEvent.change(screen.getByLabelText(/^Instructor/), { target: { value: "4" } });
    expect((screen.getByLabelText(/^Site/) as HTMLSelectElement).value).toBe("");
  });
});

const detail: ActionDetailAnswer = {
  action,
  notes: [{ id: 1, date: "2026-03-01", text: "First session held", createdAt: "2026-03-01T09:00:00.000Z" }],
  mayManage: false,
  evaluation: {
    resolution: "quarter",
    startQuarter: "2026-Q1",
    before: { from: "2025-Q4", to: "2025-Q4", x: 20, n: 20, rate: 1 },
    after: { from: "2026-Q2", to: "2026-Q2", x: 4, n: 30, rate: 4 / 30 },
    difference: { difference: -0.8667, low: -0.9469, high: -0.6371 },
    verdict: "down",
    targetMet: true,
    points: [
      { period: "2025-Q4", phase: "before", x: 20, n: 20, rate: 1 },
      { period: "2026-Q1", phase: "transition", x: 182, n: 263, rate: 182 / 263 },
      { period: "2026-Q2", phase: "after", x: 4, n: 30, rate: 4 / 30 },
    ],
    runChart: { baselineMedian: 1, useful: 2, longestRun: 2, longestRunLimit: 4, crossings: 0, crossingsLimit: 0, signal: false },
  },
};

describe("the action page", () => {
  it("words the before/after comparison with its interval and shows an instructor no way to change it", async () => {
    fakeServer({ "GET /api/me": sessionFor("instructor"), "GET /api/actions/3": answer(actionDetailAnswerSchema, detail) });
    renderApp("/actions/3");
    expect(await screen.findByRole("heading", { name: "Infant depth refresher" })).toBeTruthy();
    expect(screen.getByTestId("before").textContent).toContain("100.0 % (20 of 20 attempts, 2025 Q4)");
    expect(screen.getByTestId("after").textContent).toContain("13.3 % (4 of 30 attempts, 2026 Q2)");
    expect(screen.getByTestId("difference").textContent).toBe("−86.7 points (95 % interval −94.7 points to −63.7 points): lower after the start.");
    expect(screen.getByText("First session held")).toBeTruthy();
    expect(screen.queryByRole("button", { name: "Change" })).toBeNull();
    expect(screen.queryByRole("button", { name: "Add note" })).toBeNull();
    expect(screen.getByText(/not proof that the action caused a change/)).toBeTruthy();
  });

  it("draws the months split at the start and says in words whether they shifted", async () => {
    const rules = { useful: 0, longestRun: 0, longestRunLimit: null, crossings: 0, crossingsLimit: null, signal: false };
    const point = (period: string, phase: "before" | "transition" | "after", x: number, n: number) => ({ period, phase, x, n, rate: x / n });
    const chart: MonthlyRunChart = {
      aim: "too_shallow",
      baseline: { from: "2025-09", to: "2026-01", months: 5 },
      points: [
        point("2025-09", "before", 9, 20),
        point("2025-10", "before", 10, 20),
        point("2025-11", "before", 11, 20),
        point("2025-12", "before", 10, 20),
        point("2026-01", "before", 12, 20),
        point("2026-02", "transition", 8, 20),
        ...["2026-03", "2026-04", "2026-05", "2026-06", "2026-07", "2026-08", "2026-09"].map((month) => point(month, "after", 4, 20)),
      ],
      phases: [
        { phase: "before", from: "2025-09", to: "2026-01", median: 0.5, rules: { ...rules, median: 0.5 } },
        { phase: "after", from: "2026-03", to: "2026-09", median: 0.2, rules: { ...rules, median: 0.2 } },
      ],
      // seven months after the start, all below the median before: a run of 7 over the limit round(log2(7) + 3) = 6
      median: 0.5,
      useful: 7,
      longestRun: 7,
      longestRunLimit: 6,
      crossings: 0,
      crossingsLimit: 1,
      signal: true,
    };
    fakeServer({
      "GET /api/me": sessionFor("quality_lead"),
      "GET /api/actions/3": answer(actionDetailAnswerSchema, detail),
      "GET /api/actions/3/monthly": answer(actionMonthlyAnswerSchema, { chart }),
    });
    renderApp("/actions/3");
    const signal = await screen.findByTestId("monthly-signal");
    expect(signal.textContent).toBe(
      "The median is 20.0 % after the start against 50.0 % before it. A shift is signalled: 7 months in a row after the start lie on one side of the median before it (more than 6 is unlikely by chance).",
    );
    expect(screen.getByText(/the months before the start and the months after it are summarised separately/)).toBeTruthy();
  });

  it("tells an instructor why the months of another scope are not shown", async () => {
    fakeServer({
      "GET /api/me": sessionFor("instructor"),
      "GET /api/actions/3": answer(actionDetailAnswerSchema, detail),
      "GET /api/actions/3/monthly": answer(actionMonthlyAnswerSchema, { chart: null }),
    });
    renderApp("/actions/3");
    expect(await screen.findByText(/the monthly chart is shown for your own actions only/)).toBeTruthy();
  });

  it("offers a quality lead the change and note forms", async () => {
    fakeServer({
      "GET /api/me": sessionFor("quality_lead"),
      "GET /api/actions/3": answer(actionDetailAnswerSchema, { ...detail, mayManage: true }),
      ...directory,
    });
    renderApp("/actions/3");
    expect(await screen.findByRole("button", { name: "Change" })).toBeTruthy();
    expect(screen.getByRole("button", { name: "Add note" })).toBeTruthy();
  });
});

describe("action marks on trend charts", () => {
  const marks = [{ id: 3, title: "Infant depth refresher", startDate: "2026-02-15", quarter: "2026-Q1" }];

  it("names each action starting in the chart's quarters in the pass-rate chart's description", async () => {
    const { PassRateControlChart } = await import("../../src/features/insight/charts/PassRateControlChart");
    const point = (quarter: string, passed: number) => ({
      quarter,
      attempts: 20,
      passed,
      rate: passed / 20,
      low: 0.2,
      high: 0.8,
      lcl: 0.1,
      ucl: 0.9,
      outside: false,
      suppressed: false,
    });
    const series = {
      centre: 0.5,
      baseline: { from: "2025-Q4", to: "2026-Q2", source: "default" as const, attempts: 60 },
      limits: "binomial" as const,
      sigmaZ: null,
      points: [point("2025-Q4", 8), point("2026-Q1", 10), point("2026-Q2", 12)],
      runChart: null,
      split: null,
    };
    render(
      <PassRateControlChart series={series} minCount={5} actions={[...marks, { id: 4, title: "Too early", startDate: "2024-01-10", quarter: "2024-Q1" }]} />,
    );
    const text = document.body.textContent ?? "";
    expect(text).toContain(`Improvement actions marked: A1 Infant depth refresher (from ${formatDay("2026-02-15")}, 2026 Q1).`);
    // an action outside the chart's quarters has no place on its axis
    expect(text).not.toContain("Too early");
  });

  it("steps the pass-rate chart's centre line at a split and says where the new phase's centre comes from", async () => {
    const { PassRateControlChart } = await import("../../src/features/insight/charts/PassRateControlChart");
    const point = (quarter: string, passed: number) => ({
      quarter,
      attempts: 20,
      passed,
      rate: passed / 20,
      low: 0.2,
      high: 0.8,
      lcl: 0.1,
      ucl: 0.9,
      outside: false,
      suppressed: false,
    });
    const series = {
      centre: 0.4,
      baseline: { from: "2025-Q1", to: "2025-Q4", source: "default" as const, attempts: 80 },
      limits: "binomial" as const,
      sigmaZ: null,
      points: [point("2025-Q4", 8), point("2026-Q1", 10), point("2026-Q2", 12)],
      runChart: null,
      split: { date: "2026-01-01", quarter: "2026-Q1", centre: 0.55, baseline: { from: "2026-Q1", to: "2026-Q4", attempts: 80 }, sigmaZ: null },
    };
    render(<PassRateControlChart series={series} minCount={5} actions={marks} />);
    const text = document.body.textContent ?? "";
    expect(text).toContain(`The chart is split at ${formatDay("2026-01-01")}: from 2026 Q1 the quarters form a phase of their own, with a centre line of 55`);
    // the table view gives each quarter the centre it is judged against: 40 % before the split, 55 % after
    const { seriesColumns } = await import("../../src/features/insight/charts/PassRateControlChart");
    const centre = seriesColumns(5, series).find((column) => column.key === "centre")!;
    expect(centre.header).toBe("Centre line (%)");
    expect(series.points.map((p) => centre.value(p))).toEqual([40, 55, 55]);
    expect(seriesColumns(5, { ...series, split: null }).some((column) => column.key === "centre")).toBe(false);
  });

  it("says a young phase is judged against the limits before the split", async () => {
    const { splitSentence } = await import("../../src/features/insight/charts/PassRateControlChart");
    const series = { split: { date: "2026-05-10", quarter: "2026-Q3", centre: null, baseline: null, sigmaZ: null } } as Parameters<typeof splitSentence>[0];
    expect(splitSentence(series)).toContain("judged against the limits before the split until it has four quarters with attempts");
  });

  it("names them in the error trend chart's description too", async () => {
    const { TechniqueErrorTrendChart } = await import("../../src/features/techniqueErrors/TechniqueErrorTrendChart");
    const row = (quarter: string, count: number) => ({ quarter, attempts: 20, count, share: count / 20, low: 0.1, high: 0.6 });
    render(<TechniqueErrorTrendChart label="Too shallow" trend={[row("2025-Q4", 8), row("2026-Q1", 6)]} actions={marks} />);
    expect(document.body.textContent).toContain(`Improvement actions marked: A1 Infant depth refresher (from ${formatDay("2026-02-15")}, 2026 Q1).`);
  });

  it("lists the marked actions under the error trend chart as links to their evaluation", async () => {
    const { ActionMarkList } = await import("../../src/features/actions/ActionMarkList");
    const { MemoryRouter } = await import("react-router");
    render(
      <MemoryRouter>
        <ActionMarkList marks={[...marks, { id: 4, title: "Too early", startDate: "2024-01-10", quarter: "2024-Q1" }]} quarters={["2025-Q4", "2026-Q1"]} />
      </MemoryRouter>,
    );
    expect(screen.getByRole("link", { name: "Infant depth refresher" }).getAttribute("href")).toBe("/actions/3");
    expect(document.body.textContent).toContain(`A1 Infant depth refresher (from ${formatDay("2026-02-15")}, 2026 Q1)`);
    expect(screen.queryByText("Too early")).toBeNull();
  });
});
