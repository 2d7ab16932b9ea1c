// After a write that changes figures, no page may keep showing the answers from before it: each write
// invalidates the query families whose answers it changes, and a write made elsewhere (the CLI) is noticed
// through the server's data version when the window regains focus.
import { QueryClientProvider, focusManager, type QueryClient, type QueryKey } from "@tanstack/react-query";
import { act, cleanup, configure, fireEvent, renderHook, render, screen, waitFor, within } from "@testing-library/react";
import type { ReactNode } from "react";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import {
  batchListResponseSchema,
  jobResponseSchema,
  presetListResponseSchema,
  type ImportBatch,
  type ImportJob,
  type Preview,
  type Upload,
} from "../../shared/import/api";
import { importColumns } from "../../shared/import/columns";
import { dataVersionAnswerSchema } from "../../shared/schemas/dataVersion";
import { DEFAULT_POLICY } from "../../shared/scoring/policy";
import { setCsrfToken } from "../../src/api/http";
import { figureQueryFamilies } from "../../src/app/figureQueries";
import { createQueryClient } from "../../src/app/queryClient";
import { authQueries } from "../../src/features/auth/queries";
import { insightQueries } from "../../src/features/insight/queries";
import { reportQueries } from "../../src/features/report/queries";
import { VersionsPanel } from "../../src/features/report/VersionsPanel";
import { useRescore, useSavePolicy } from "../../src/features/settings/mutations";
import { settingsQueries } from "../../src/features/settings/queries";
import { appliedBatch } from "./importBatch";
import { formatsWithoutColumns } from "./importFormats";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 15_000 });

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

/** One answer cached under each figure family, plus the signed-in user and the settings, which are not figures. */
function seedAnswers(queryClient: QueryClient): { figures: QueryKey[]; me: QueryKey; settings: QueryKey } {
  const figures = figureQueryFamilies.map((family) => [...family, "seeded"]);
  for (const key of figures) queryClient.setQueryData(key, { before: true });
  const me = authQueries.me().queryKey;
  queryClient.setQueryData(me, sessionFor("coordinator").body as never);
  const settings = [...settingsQueries.all(), "seeded"];
  queryClient.setQueryData(settings, { before: true });
  return { figures, me, settings };
}

const invalidated = (queryClient: QueryClient, key: QueryKey) => queryClient.getQueryState(key)?.isInvalidated ?? false;

function withClient(queryClient: QueryClient) {
  return ({ children }: { children: ReactNode }) => <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}

const policyVersion = { version: 2, policy: DEFAULT_POLICY, note: "Depth band widened", createdAt: "2026-10-01T09:00:00.000Z" };

describe("writes made on this page", () => {
  beforeEach(() => setCsrfToken("token-1"));

  it("saving a new scoring policy invalidates every figure family and the settings, not the signed-in user", async () => {
    fakeServer({ "PUT /api/settings/policy": { status: 200, body: policyVersion } });
    const queryClient = createQueryClient();
    const seeded = seedAnswers(queryClient);
    const { result } = renderHook(() => useSavePolicy(), { wrapper: withClient(queryClient) });

    await act(() => result.current.mutateAsync({ policy: DEFAULT_POLICY, note: "Depth band widened" }));

    for (const key of seeded.figures) expect(invalidated(queryClient, key), JSON.stringify(key)).toBe(true);
    expect(invalidated(queryClient, seeded.settings)).toBe(true);
    expect(invalidated(queryClient, seeded.me)).toBe(false);
  });

  it("rescoring invalidates every figure family", async () => {
    fakeServer({ "POST /api/settings/rescore": { status: 200, body: { version: 2, examined: 12, changed: 3 } } });
    const queryClient = createQueryClient();
    const seeded = seedAnswers(queryClient);
    const { result } = renderHook(() => useRescore(), { wrapper: withClient(queryClient) });

    await act(() => result.current.mutateAsync({}));

    for (const key of seeded.figures) expect(invalidated(queryClient, key), JSON.stringify(key)).toBe(true);
  });

  it("a refused rescore leaves the cached figures alone", async () => {
    fakeServer({ "POST /api/settings/rescore": { status: 409, body: { error: { code: "busy", message: "An import is running" } } } });
    const queryClient = createQueryClient();
    const seeded = seedAnswers(queryClient);
    const { result } = renderHook(() => useRescore(), { wrapper: withClient(queryClient) });

    await act(() => result.current.mutateAsync({}).catch(() => undefined));

    for (const key of seeded.figures) expect(invalidated(queryClient, key)).toBe(false);
  });

  it("creating a report version invalidates the report answers only", async () => {
    const version = {
      id: 4,
      period: "2026-Q3",
      version: 1,
      createdAt: "2026-10-02T09:00:00.000Z",
      createdBy: "Robin Example",
      pdfBytes: 20_480,
      lastSend: null,
    };
    fakeServer({ "POST /api/reports/2026-Q3": { status: 201, body: { report: version } } });
    const queryClient = createQueryClient();
    seedAnswers(queryClient);
    const reportKey = reportQueries.versions("2026-Q3").queryKey;
    queryClient.setQueryData(reportKey, []);
    render(<VersionsPanel period="2026-Q3" versions={[]} onCreated={() => undefined} />, { wrapper: withClient(queryClient) });

    fireEvent.click(screen.getByRole("button", { name: "Create report version" }));

    await waitFor(() => expect(invalidated(queryClient, reportKey)).toBe(true));
    expect(invalidated(queryClient, [...insightQueries.all(), "seeded"])).toBe(false);
  });
});

const batch = appliedBatch;

const historyPath = "GET /api/imports/batches?limit=25&offset=0";

describe("the imports page", () => {
  it("undoing a batch invalidates every figure family", async () => {
    fakeServer({
      "GET /api/me": sessionFor("coordinator"),
      [historyPath]: answer(batchListResponseSchema, { batches: [batch], total: 1 }),
      "GET /api/imports/formats": formatsWithoutColumns,
      "GET /api/data-version": answer(dataVersionAnswerSchema, { version: "run:1:0" }),
      "POST /api/imports/batches/3/undo": {
        status: 200,
        body: { batch: { ...batch, status: "undone", undoneAt: "2026-10-02T09:00:00.000Z" }, deleted: 12, restored: 0 },
      },
    });
    const { queryClient } = renderApp("/imports");
    const overviewKey = [...insightQueries.all(), "overview", { quarter: "2026-Q3" }];
    queryClient.setQueryData(overviewKey, { before: true });

    // the history is drawn as a table and as cards (for narrow screens): either button opens the dialog
    fireEvent.click((await screen.findAllByRole("button", { name: "Undo batch 3" }))[0]);
    const dialog = await screen.findByRole("dialog");
    fireEvent.click(within(dialog).getByRole("button", { name: "Undo batch 3" }));

    await screen.findByText(/Batch 3 \(wrenmoor-q3\.csv\) is undone/);
    expect(invalidated(queryClient, overviewKey)).toBe(true);
  });

  it("a finished web import invalidates every figure family", async () => {
    // Uploads go through XMLHttpRequest (for progress); this stand-in answers with the scripted upload.
    const header = importColumns.classes.map((column) => column.name);
    const upload: Upload = { id: "u1", fileName: "classes.csv", kind: "classes", size: 256, uploadedAt: "2026-10-01T09:00:00.000Z" };
    const preview: Preview = {
      delimiter: "comma",
      header,
      rows: [],
      columns: [],
      extra: [],
      problems: [],
      suggestedMapping: { columns: {}, units: { depth: "mm", time: "ms", shares: "percent" }, values: {} },
    };
    class UploadXhr {
      status = 201;
      responseText = JSON.stringify({ upload, preview });
      withCredentials = false;
      upload = { onprogress: null };
      onload: (() => void) | null = null;
      open() {}
      setRequestHeader() {}
      abort() {}
      send() {
        queueMicrotask(() => this.onload?.());
      }
    }
    vi.stubGlobal("XMLHttpRequest", UploadXhr);
    const summary = (dryRun: boolean) => ({
      file: "classes.csv",
      kind: "classes" as const,
      dryRun,
      status: dryRun ? ("validated" as const) : ("imported" as const),
      batchId: dryRun ? null : 9,
      sha256: null,
      unit: "rows" as const,
      delimiter: "comma" as const,
      rowsRead: 1,
      inserted: 1,
      updated: 0,
      unchanged: 0,
      rejected: 0,
      attemptsRead: null,
      attemptsRejected: null,
      newCodes: { sites: [], instructors: [], manikins: [] },
      warnings: [],
      issues: [],
      issuesTotal: 0,
      durationMs: 3,
    });
    const job = (id: string, mode: "validate" | "import"): ImportJob => ({
      id,
      uploadId: "u1",
      mode,
      status: "done",
      progress: { bytesRead: 256, totalBytes: 256, rows: 1 },
      summary: summary(mode === "validate"),
      error: null,
      rejectedCsvUrl: null,
      createdAt: "2026-10-01T09:00:01.000Z",
    });
    fakeServer({
      "GET /api/me": sessionFor("coordinator"),
      [historyPath]: answer(batchListResponseSchema, { batches: [], total: 0 }),
      "GET /api/imports/formats": formatsWithoutColumns,
      "GET /api/imports/presets?kind=classes": answer(presetListResponseSchema, { presets: [] }),
      "GET /api/data-version": answer(dataVersionAnswerSchema, { version: "run:1:0" }),
      "POST /api/imports/uploads/u1/validate": { status: 202, body: { job: { ...job("job-v", "validate"), status: "queued", summary: null } } },
      "GET /api/imports/jobs/job-v": answer(jobResponseSchema, { job: job("job-v", "validate") }),
      "POST /api/imports/uploads/u1/import": { status: 202, body: { job: { ...job("job-i", "import"), status: "queued", summary: null } } },
      "GET /api/imports/jobs/job-i": answer(jobResponseSchema, { job: job("job-i", "import") }),
    });
    const { queryClient } = renderApp("/imports");
    const seeded = figureQueryFamilies.map((family) => [...family, "seeded"]);

    await screen.findByRole("heading", { name: /Step 1 of 4/ });
    fireEvent.click(screen.getByRole("radio", { name: /Class logs/ }));
    fireEvent.change(screen.getByLabelText("CSV file"), { target: { files: [new File([header.join(",")], "classes.csv", { type: "text/csv" })] } });
    fireEvent.click(screen.getByRole("button", { name: "Upload and preview" }));
    fireEvent.click(await screen.findByRole("button", { name: "Validate the file" }));
    const importButton = await screen.findByRole("button", { name: /^Import 1 row/ });
    // Seeded only now, so nothing but the finished import can have invalidated them.
    for (const key of seeded) queryClient.setQueryData(key, { before: true });
    fireEvent.click(importButton);

    await screen.findByText(/classes\.csv is imported as batch 9/);
    for (const key of seeded) expect(invalidated(queryClient, key), JSON.stringify(key)).toBe(true);
  });
});

describe("writes made elsewhere", () => {
  it("a CLI import while the page is open shows when the window regains focus", async () => {
    let version = "run:1:0";
    let batches: ImportBatch[] = [];
    const server = fakeServer({
      "GET /api/me": sessionFor("coordinator"),
      [historyPath]: () => answer(batchListResponseSchema, { batches, total: batches.length }),
      "GET /api/imports/formats": formatsWithoutColumns,
      "GET /api/data-version": () => answer(dataVersionAnswerSchema, { version }),
    });
    renderApp("/imports");
    await screen.findByText("No imports yet");

    // the CLI writes a batch: the database state changes
    batches = [{ ...batch, source: "cli", fileName: "network-q3-cli.csv" }];
    version = "run:2:0";
    act(() => {
      window.dispatchEvent(new Event("focus"));
    });

    expect((await screen.findAllByText("network-q3-cli.csv")).length).toBeGreaterThan(0);
    expect(server.requests.filter((r) => r.path === "/api/data-version").length).toBeGreaterThanOrEqual(2);
  });

  it("a tab shown again with the same data version refetches no figures", async () => {
    const server = fakeServer({
      "GET /api/me": sessionFor("coordinator"),
      [historyPath]: answer(batchListResponseSchema, { batches: [batch], total: 1 }),
      "GET /api/imports/formats": formatsWithoutColumns,
      "GET /api/data-version": answer(dataVersionAnswerSchema, { version: "run:1:0" }),
    });
    renderApp("/imports");
    await screen.findAllByText("wrenmoor-q3.csv");
    const historyAsks = () => server.requests.filter((r) => r.path === "/api/imports/batches?limit=25&offset=0").length;
    const before = historyAsks();
    const versionAsks = server.requests.filter((r) => r.path === "/api/data-version").length;

    act(() => {
      focusManager.setFocused(false);
      focusManager.setFocused(true);
    });

    await waitFor(() => expect(server.requests.filter((r) => r.path === "/api/data-version").length).toBeGreaterThan(versionAsks));
    expect(historyAsks()).toBe(before);
    focusManager.setFocused(undefined);
  });
});
