// The fake API itself: what it answers, what it records, and that a fixture off the answer schema is refused.
import { describe, expect, it } from "vitest";
import { optionsAnswerSchema, type OptionsAnswer } from "../../shared/schemas/insight";
import { answer, fakeServer, unknownRoute } from "./testServer";

const options: OptionsAnswer = {
  quarters: ["2026-Q3"],
  sites: [],
  patientTypes: ["adult"],
  feedbackModes: ["live"],
  errors: [],
  instructors: [],
  manikins: [],
};

describe("the component tests' fake API", () => {
  it("answers a listed route only for the exact query, and an unlisted one as the server does", async () => {
    fakeServer({ "GET /api/insight/overview?quarter=2026-Q3": { status: 200, body: { ok: true } } });
    const listed = await fetch("/api/insight/overview?quarter=2026-Q3");
    expect(listed.status).toBe(200);
    expect(await listed.json()).toEqual({ ok: true });
    const otherQuery = await fetch("/api/insight/overview?quarter=2026-Q2");
    expect(otherQuery.status).toBe(unknownRoute.status);
    expect(await otherQuery.json()).toEqual(unknownRoute.body);
  });

  it("records method, path with query, lower-case headers and the JSON body", async () => {
    const server = fakeServer({ "PUT /api/me/alerts": (request) => ({ status: 200, body: request.body }) });
    const res = await fetch("/api/me/alerts?x=1", {
      method: "PUT",
      headers: { "Content-Type": "application/json", "X-CSRF-Token": "t" },
      body: JSON.stringify({ kinds: ["drift"] }),
    });
    expect(res.status).toBe(404); // the query is part of the route
    await fetch("/api/me/alerts", { method: "PUT", headers: { "content-type": "application/json" }, body: JSON.stringify({ kinds: ["shift"] }) });
    expect(server.requests).toEqual([
      { method: "PUT", path: "/api/me/alerts?x=1", headers: { "content-type": "application/json", "x-csrf-token": "t" }, body: { kinds: ["drift"] } },
      { method: "PUT", path: "/api/me/alerts", headers: { "content-type": "application/json" }, body: { kinds: ["shift"] } },
    ]);
  });

  it("lets no request leave for another address", async () => {
    fakeServer({});
    await expect(fetch("https://elsewhere.example/api/me")).rejects.toThrow();
  });

  it("serves a fixture that fits its answer schema as written", () => {
    expect(answer(optionsAnswerSchema, options)).toEqual({ status: 200, body: options });
  });

  it("refuses a fixture that drifted from the answer schema, naming the field", () => {
    const drifted = { ...options, quarters: undefined, quarterList: ["2026-Q3"] };
    expect(() => answer(optionsAnswerSchema, drifted as unknown as typeof options)).toThrow(/does not fit the answer schema[\s\S]*quarters/);
  });
});
