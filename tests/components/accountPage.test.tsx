// The account page says who changes a user's details in words that fit the user's role.
import { cleanup, configure, screen } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { dataVersionAnswerSchema } from "../../shared/schemas/dataVersion";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 15_000 });
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe("my account", () => {
  it("sends a coordinator to the Users page instead of to a coordinator", async () => {
    fakeServer({ "GET /api/me": sessionFor("coordinator"), "GET /api/data-version": answer(dataVersionAnswerSchema, { version: "run:1:0" }) });
    renderApp("/account");
    expect((await screen.findByRole("link", { name: "Users" })).getAttribute("href")).toBe("/admin/users");
    expect(screen.queryByText(/ask your regional coordinator/)).toBeNull();
  });

  it("tells anyone else to ask the regional coordinator", async () => {
    fakeServer({ "GET /api/me": sessionFor("instructor"), "GET /api/data-version": answer(dataVersionAnswerSchema, { version: "run:1:0" }) });
    renderApp("/account");
    expect(await screen.findByText("To change your name, e-mail or role, ask your regional coordinator.")).toBeTruthy();
  });
});
