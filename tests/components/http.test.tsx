import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { ApiError, http, setCsrfToken } from "../../src/api/http";
import { fakeServer, sessionFor } from "./testServer";

beforeEach(() => setCsrfToken(null));
afterEach(() => vi.unstubAllGlobals());

describe("http", () => {
  it("sends the in-memory CSRF token on changes but not on reads", async () => {
    const server = fakeServer({
      "GET /api/sites": { status: 200, body: { sites: [] } },
      "POST /api/sites": { status: 200, body: { site: { id: 1 } } },
    });
    setCsrfToken("token-a");
    await http.get("/api/sites");
    await http.post("/api/sites", { code: "N-1", name: "North" });
    expect(server.requests[0].headers["x-csrf-token"]).toBeUndefined();
    expect(server.requests[1].headers["x-csrf-token"]).toBe("token-a");
    expect(server.requests[1].headers["content-type"]).toBe("application/json");
  });

  it("on a 403 'csrf' answer fetches a fresh token from /api/me and retries once", async () => {
    let attempts = 0;
    const server = fakeServer({
      "GET /api/me": sessionFor("coordinator"), // carries csrfToken "token-1"
      "PATCH /api/sites/3": (request) => {
        attempts += 1;
        const token = request.headers["x-csrf-token"];
        return token === "token-1" ? { status: 200, body: { site: { id: 3 } } } : { status: 403, body: { error: { code: "csrf", message: "Stale token" } } };
      },
    });
    setCsrfToken("stale");
    await expect(http.patch("/api/sites/3", { name: "North" })).resolves.toEqual({ site: { id: 3 } });
    expect(attempts).toBe(2);
    expect(server.requests.map((r) => `${r.method} ${r.path}`)).toEqual(["PATCH /api/sites/3", "GET /api/me", "PATCH /api/sites/3"]);
  });

  it("retries only once, then reports the failure", async () => {
    fakeServer({
      "GET /api/me": sessionFor("coordinator"),
      "POST /api/users": { status: 403, body: { error: { code: "csrf", message: "Bad token" } } },
    });
    setCsrfToken("stale");
    const failure = await http.post("/api/users", {}).catch((error: unknown) => error);
    expect(failure).toBeInstanceOf(ApiError);
    expect((failure as ApiError).code).toBe("csrf");
  });

  it("does not retry a 403 that is about the role", async () => {
    const server = fakeServer({ "POST /api/users": { status: 403, body: { error: { code: "forbidden", message: "Coordinators only" } } } });
    setCsrfToken("token");
    await expect(http.post("/api/users", {})).rejects.toMatchObject({ status: 403, code: "forbidden", message: "Coordinators only" });
    expect(server.requests).toHaveLength(1);
  });

  it("turns the server's error shape into ApiError with details", async () => {
    const details = [{ path: ["email"], message: "Already in use" }];
    fakeServer({ "POST /api/users": { status: 409, body: { error: { code: "conflict", message: "E-mail already in use", details } } } });
    setCsrfToken("token");
    await expect(http.post("/api/users", {})).rejects.toMatchObject({ status: 409, code: "conflict", details });
  });

  it("gives a readable message when an error answer has no body", async () => {
    fakeServer({ "GET /api/sites": { status: 413 } });
    await expect(http.get("/api/sites")).rejects.toMatchObject({ status: 413, code: "http_413", message: "The file is too large to upload." });
  });

  it("returns undefined for 204", async () => {
    fakeServer({ "POST /api/auth/logout": { status: 204 } });
    setCsrfToken("token");
    await expect(http.post("/api/auth/logout")).resolves.toBeUndefined();
  });
});
