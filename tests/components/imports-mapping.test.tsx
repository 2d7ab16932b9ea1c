import { cleanup, configure, fireEvent, screen } from "@testing-library/react";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { batchListResponseSchema, jobResponseSchema, presetListResponseSchema, type ImportJob, type Preview, type Upload } from "../../shared/import/api";
import { importColumns } from "../../shared/import/columns";
import { importMappingSchema } from "../../shared/import/mapping";
import { buildMapping, draftFromMapping, draftProblems, unknownValues } from "../../src/features/imports/mappingDraft";
import { formatsWithoutColumns } from "./importFormats";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor, type RecordedRequest } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
// The page is loaded lazily, which takes a while on a busy machine.
configure({ asyncUtilTimeout: 15_000 });

/** Uploads go through XMLHttpRequest (for progress); this one answers each send() with the next scripted answer. */
class ScriptedXhr {
  static answers: { status: number; body: unknown }[] = [];
  static sent: { method: string; url: string; body: unknown }[] = [];
  status = 0;
  responseText = "";
  withCredentials = false;
  upload: { onprogress: ((event: { loaded: number; total: number; lengthComputable: boolean }) => void) | null } = { onprogress: null };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;
  ontimeout: (() => void) | null = null;
  private method = "";
  private url = "";
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader() {}
  abort() {
    this.onabort?.();
  }
  send(body: unknown) {
    ScriptedXhr.sent.push({ method: this.method, url: this.url, body });
    const answer = ScriptedXhr.answers.shift()!;
    queueMicrotask(() => {
      this.status = answer.status;
      this.responseText = JSON.stringify(answer.body);
      this.onload?.();
    });
  }
}

beforeEach(() => {
  ScriptedXhr.answers = [];
  ScriptedXhr.sent = [];
  vi.stubGlobal("XMLHttpRequest", ScriptedXhr);
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// An attempt summary export from another tool: two columns carry other names, depths are in inches.
const header = importColumns.attempts.map((c) => (c.name === "learner" ? "Learner Code" : c.name === "depth_mm" ? "Depth (in)" : c.name));
const firstRow = [
  "A-1",
  "C-1",
  "L-0001",
  "MK-1",
  "adult",
  "live",
  "2026-07-14T09:30:00Z",
  "120",
  "230",
  "112",
  "2.1",
  "85",
  "10",
  "5",
  "80",
  "12",
  "8",
  "90",
  "85",
  "4",
  "pass",
];

const upload: Upload = { id: "u1", fileName: "export.csv", kind: "attempts", size: 512, uploadedAt: "2026-07-20T10:00:00.000Z" };
const preview: Preview = {
  delimiter: "comma",
  header,
  rows: [firstRow],
  columns: [],
  extra: [],
  problems: [],
  // The server recognised the learner column but not the depth one.
  suggestedMapping: { columns: { learner: "Learner Code" }, units: { depth: "mm", time: "ms", shares: "percent" }, values: {} },
};

const doneJob: ImportJob = {
  id: "job-1",
  uploadId: "u1",
  mode: "validate",
  status: "done",
  progress: { bytesRead: 512, totalBytes: 512, rows: 1 },
  summary: {
    file: "export.csv",
    kind: "attempts",
    dryRun: true,
    status: "validated",
    delimiter: "comma",
    batchId: null,
    sha256: null,
    unit: "rows",
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
  },
  error: null,
  rejectedCsvUrl: null,
  createdAt: "2026-07-20T10:00:01.000Z",
};

/** The Imports page's routes, with a validation job that answers `job` when polled. */
function fakeImportServer(job: ImportJob) {
  return fakeServer({
    "GET /api/me": sessionFor("coordinator"),
    "GET /api/imports/batches?limit=25&offset=0": answer(batchListResponseSchema, { batches: [], total: 0 }),
    "GET /api/imports/formats": formatsWithoutColumns,
    "GET /api/imports/presets?kind=attempts": answer(presetListResponseSchema, { presets: [] }),
    "POST /api/imports/uploads/u1/validate": { status: 202, body: { job: { ...doneJob, status: "queued", summary: null } } },
    "GET /api/imports/jobs/job-1": answer(jobResponseSchema, { job }),
  });
}

/** Opens the page, chooses attempt summaries and uploads the file; resolves on the mapping step. */
async function uploadOnPage() {
  renderApp("/imports");
  await screen.findByRole("heading", { name: /Step 1 of 4/ });
  fireEvent.click(screen.getByRole("radio", { name: /Attempt summaries/ }));
  fireEvent.change(screen.getByLabelText("CSV file"), { target: { files: [new File([header.join(",")], "export.csv", { type: "text/csv" })] } });
  fireEvent.click(screen.getByRole("button", { name: "Upload and preview" }));
  await screen.findByRole("heading", { name: /Step 2 of 4/ });
}

describe("mapping step", () => {
  it("sends the mapping JSON the server's schema expects: renames, depth in inches, no value translations", async () => {
    const server = fakeImportServer(doneJob);
    ScriptedXhr.answers.push({ status: 201, body: { upload, preview } });

    await uploadOnPage();
    expect(ScriptedXhr.sent[0]).toMatchObject({ method: "POST", url: "/api/imports/uploads" });
    expect((ScriptedXhr.sent[0].body as FormData).get("kind")).toBe("attempts");

    // depth_mm is required and not matched yet: validating is held back with the reason.
    fireEvent.click(screen.getByRole("button", { name: "Validate the file" }));
    expect(screen.getAllByText(/required column "depth_mm" is missing from the header/).length).toBeGreaterThan(0);
    expect(server.requests.some((r) => r.method === "POST")).toBe(false);

    fireEvent.change(screen.getByLabelText("File column for depth_mm"), { target: { value: "Depth (in)" } });
    fireEvent.click(screen.getByRole("radio", { name: "inches (in)" }));
    // The first value is shown converted: 2.1 in × 25.4 mm/in = 53.34 mm (1 in = 25.4 mm exactly, international inch of 1959).
    expect(screen.getByText("First row: 2.1 in → 53.3 mm")).toBeTruthy();
    fireEvent.click(screen.getByRole("button", { name: "Validate the file" }));

    await screen.findByRole("heading", { name: /Step 3 of 4/ });
    const validate = server.requests.find((r: RecordedRequest) => r.method === "POST" && r.path === "/api/imports/uploads/u1/validate")!;
    const expected = {
      columns: { learner: "Learner Code", depth_mm: "Depth (in)" },
      units: { depth: "in", time: "ms", shares: "percent" },
      values: {},
    };
    expect(validate.body).toEqual({ mapping: expected, skipInvalid: false });
    // The server parses it with the shared schema: it must come through unchanged.
    expect(importMappingSchema.parse((validate.body as { mapping: unknown }).mapping)).toEqual(expected);
    await screen.findByText("All 1 rows can be imported. Nothing has been written yet.");
  });
});

describe("a job the server's restart cut short", () => {
  it("shows the server's message, offers the way back and stops asking", async () => {
    const message = "The server restarted before this check finished. Nothing was written. Upload the file again to check it.";
    const interrupted: ImportJob = { ...doneJob, status: "interrupted", progress: { bytesRead: 0, totalBytes: 512, rows: 0 }, summary: null, error: message };
    const server = fakeImportServer(interrupted);
    ScriptedXhr.answers.push({
      status: 201,
      body: {
        upload,
        preview: { ...preview, suggestedMapping: { ...preview.suggestedMapping, columns: { learner: "Learner Code", depth_mm: "Depth (in)" } } },
      },
    });

    await uploadOnPage();
    fireEvent.click(screen.getByRole("button", { name: "Validate the file" }));

    expect(await screen.findByText(message)).toBeTruthy();
    expect(screen.getByRole("button", { name: "Upload a corrected file" })).toBeTruthy();
    const polls = () => server.requests.filter((r) => r.path === "/api/imports/jobs/job-1").length;
    const seen = polls();
    // the page asks every 400 ms while a job is unfinished; an interrupted job is finished
    await new Promise((resolve) => setTimeout(resolve, 1000));
    expect(polls()).toBe(seen);
  });
});

describe("mapping draft", () => {
  it("leaves out columns read under their own name and translations left empty", () => {
    const draft = draftFromMapping("attempts", header, preview.suggestedMapping);
    expect(draft.columns.learner).toBe("Learner Code");
    expect(draft.columns.attempt_id).toBe("attempt_id");
    expect(draft.columns.depth_mm).toBe("");
    const mapping = buildMapping("attempts", {
      ...draft,
      columns: { ...draft.columns, depth_mm: "Depth (in)" },
      units: { depth: "cm", time: "ms", shares: "fraction" },
      values: { feedback: { on: "live", off: "" } },
    });
    expect(mapping).toEqual({
      columns: { learner: "Learner Code", depth_mm: "Depth (in)" },
      units: { depth: "cm", time: "ms", shares: "fraction" },
      values: { feedback: { on: "live" } },
    });
    expect(importMappingSchema.parse(mapping)).toEqual(mapping);
  });

  it("finds missing required columns, a file column read twice, and values outside a fixed list", () => {
    const draft = draftFromMapping("attempts", header, preview.suggestedMapping);
    expect(draftProblems("attempts", header, draft).map((p) => p.column)).toEqual(["depth_mm"]);
    const twice = { ...draft, columns: { ...draft.columns, depth_mm: "rate_cpm" } };
    expect(draftProblems("attempts", header, twice)).toEqual([{ column: "depth_mm", reason: '"rate_cpm" is already read as rate_cpm' }]);
    const rows = [firstRow.map((v, i) => (header[i] === "feedback" ? "on" : v))];
    expect(unknownValues("attempts", header, rows, draft)).toEqual([{ column: "feedback", value: "on", allowed: ["live", "hidden"] }]);
  });
});
