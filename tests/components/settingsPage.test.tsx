import { cleanup, fireEvent, screen, waitFor, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { sessionAnswerSchema } from "../../shared/schemas/auth";
import { chartBaselineSchema } from "../../shared/schemas/chartSettings";
import { optionsAnswerSchema } from "../../shared/schemas/insight";
import { POLICY_FIELD_SOURCES, policySettingsAnswerSchema, policyVersionsAnswerSchema } from "../../shared/schemas/policySettings";
import { DEFAULT_POLICY, GUIDELINE_SOURCES, SAFETY_NOTE } from "../../shared/scoring/policy";
import { renderApp } from "./renderApp";
import { answer, fakeServer } from "./testServer";

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const coordinatorInInches = answer(sessionAnswerSchema, {
  user: { id: 1, email: "robin@example.org", displayName: "Robin Example", role: "coordinator", instructorId: null, siteId: null, lengthUnit: "in" },
  csrfToken: "token-1",
});
const version1 = { version: 1, policy: DEFAULT_POLICY, note: "Project defaults", createdAt: "2026-01-05T09:00:00.000Z" };

/** The policy and its versions, as every test of the page needs them. */
const policyPages = {
  "GET /api/me": coordinatorInInches,
  "GET /api/settings/policy": answer(policySettingsAnswerSchema, {
    current: version1,
    defaults: DEFAULT_POLICY,
    // copied: the constants are read-only arrays, the schema's input type plain ones
    fieldSources: [...POLICY_FIELD_SOURCES],
    sources: [...GUIDELINE_SOURCES],
    safetyNote: SAFETY_NOTE,
  }),
  "GET /api/settings/policy/versions": answer(policyVersionsAnswerSchema, { versions: [version1] }),
};

describe("settings page", { timeout: 30_000 }, () => {
  it("saves depths typed in inches as millimetres, as a new version", async () => {
    const server = fakeServer({
      ...policyPages,
      "GET /api/insight/options": answer(optionsAnswerSchema, {
        quarters: [],
        sites: [],
        patientTypes: [],
        feedbackModes: [],
        errors: [],
        instructors: [],
        manikins: [],
      }),
      "PUT /api/settings/policy": (request) => ({ status: 200, body: { ...version1, version: 2, ...(request.body as object) } }),
    });
    renderApp("/settings");
    const adult = await screen.findByRole("group", { name: "Adult" }, { timeout: 10_000 });
    // 1 in = 25.4 mm (1959 international yard and pound agreement): 1.9 in = 48.26 mm, 2.5 in = 63.5 mm.
    fireEvent.change(within(adult).getByLabelText("Depth at least (in)"), { target: { value: "1.9" } });
    fireEvent.change(within(adult).getByLabelText("Depth at most (in)"), { target: { value: "2.5" } });
    fireEvent.change(screen.getByLabelText(/Note for this version/), { target: { value: "Wider adult band for the trial" } });
    fireEvent.click(screen.getByRole("button", { name: "Save as version 2" }));

    await waitFor(() => expect(server.requests.some((r) => r.method === "PUT")).toBe(true));
    const put = server.requests.find((r) => r.method === "PUT")!;
    expect(put.path).toBe("/api/settings/policy");
    const body = put.body as { policy: typeof DEFAULT_POLICY; note: string };
    expect(body.policy.bands.adult.depthMinMm).toBe(48.26);
    expect(body.policy.bands.adult.depthMaxMm).toBe(63.5);
    expect(body.policy.bands.child).toEqual(DEFAULT_POLICY.bands.child);
    expect(body.note).toBe("Wider adult band for the trial");
    expect(await screen.findByText(/Saved as version 2/)).toBeTruthy();
  });

  it("shows the control chart's baseline and lets the coordinator choose other quarters", async () => {
    const server = fakeServer({
      ...policyPages,
      "GET /api/settings/chart-baseline": answer(chartBaselineSchema, { from: "2025-Q1", to: "2025-Q4", source: "default" }),
      "GET /api/insight/options": answer(optionsAnswerSchema, {
        quarters: ["2026-Q2", "2026-Q1", "2025-Q4", "2025-Q3", "2025-Q2", "2025-Q1"],
        sites: [],
        patientTypes: [],
        feedbackModes: [],
        errors: [],
        instructors: [],
        manikins: [],
      }),
      "PUT /api/settings/chart-baseline": (request) => ({ status: 200, body: { ...(request.body as { baseline: object }).baseline, source: "setting" } }),
    });
    renderApp("/settings");
    expect(await screen.findByText("In use: 2025 Q1 to 2025 Q4, the first four quarters with attempts (the default).", {}, { timeout: 10_000 })).toBeTruthy();
    const section = screen.getByRole("heading", { name: "Control chart baseline" }).closest("section")!;
    fireEvent.change(within(section).getByLabelText("Last baseline quarter"), { target: { value: "2025-Q2" } });
    fireEvent.change(within(section).getByLabelText("First baseline quarter"), { target: { value: "2025-Q3" } });
    expect(within(section).getByText("The last quarter must not come before the first")).toBeTruthy();
    fireEvent.change(within(section).getByLabelText("First baseline quarter"), { target: { value: "2025-Q1" } });
    fireEvent.click(within(section).getByRole("button", { name: "Use these quarters" }));
    await waitFor(() => expect(server.requests.some((r) => r.method === "PUT" && r.path === "/api/settings/chart-baseline")).toBe(true));
    expect(server.requests.find((r) => r.method === "PUT")!.body).toEqual({ baseline: { from: "2025-Q1", to: "2025-Q2" } });
  });
});
