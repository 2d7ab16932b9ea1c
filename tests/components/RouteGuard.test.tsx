import { cleanup, fireEvent, screen, waitFor, within } from "@testing-library/react";
import { lazy } from "react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { homePathFor, type AppRoute } from "../../src/app/routes";
import { renderApp } from "./renderApp";
import { fakeServer, sessionFor, signedOut } from "./testServer";

// Rendering with role queries in jsdom is slow on a busy machine; allow for it.
vi.setConfig({ testTimeout: 20_000 });

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function TestReportPage() {
  return <h1>Quarterly report page</h1>;
}

const testRoutes: AppRoute[] = [
  {
    path: "report",
    title: "Quarterly report",
    group: "quality",
    permission: "readReport",
    page: lazy(async () => ({ default: TestReportPage })),
    landing: true,
  },
  { path: "account", title: "My account", group: "you", page: lazy(async () => ({ default: () => <h1>Account page</h1> })), landing: true },
];

describe("route guard", () => {
  it("sends a signed-out visitor to sign-in, remembering the page asked for", async () => {
    fakeServer({ "GET /api/me": signedOut });
    const { router } = renderApp("/admin/users");
    expect(await screen.findByRole("heading", { name: "Sign in" })).toBeTruthy();
    expect(router.state.location.pathname).toBe("/sign-in");
    expect(new URLSearchParams(router.state.location.search).get("next")).toBe("/admin/users");
  });

  it("shows 'not available for your role' to a signed-in role without access, with the navigation still there", async () => {
    fakeServer({ "GET /api/me": sessionFor("instructor") });
    renderApp("/admin/users");
    expect(await screen.findByRole("heading", { name: "Not available for your role" })).toBeTruthy();
    expect(screen.getByText(/Regional coordinator accounts/)).toBeTruthy();
    const nav = screen.getByRole("navigation", { name: "Main" });
    expect(within(nav).queryByRole("link", { name: "Users" })).toBeNull();
    expect(within(nav).getByRole("link", { name: "My account" })).toBeTruthy();
  });

  it("shows each role only the pages it may use in the navigation, in table order", async () => {
    fakeServer({ "GET /api/me": sessionFor("funder") });
    renderApp("/account", [
      ...testRoutes,
      { path: "admin/users", title: "Users", group: "admin", permission: "manageUsers", page: lazy(async () => ({ default: () => <h1>Users</h1> })) },
      {
        path: "report/:id",
        title: "One report",
        group: "quality",
        permission: "readReport",
        nav: false,
        page: lazy(async () => ({ default: () => <h1>One</h1> })),
      },
    ]);
    const nav = await screen.findByRole("navigation", { name: "Main" });
    expect(
      within(nav)
        .getAllByRole("link")
        .map((link) => link.textContent),
    ).toEqual(["Quarterly report", "My account"]);
    expect(within(nav).getByRole("heading", { name: "Quality" })).toBeTruthy();
    expect(within(nav).queryByRole("heading", { name: "Administration" })).toBeNull();
  });

  it("returns to the page asked for after signing in", async () => {
    let signedIn = false;
    fakeServer({
      "GET /api/me": () => (signedIn ? sessionFor("funder") : signedOut),
      "GET /api/auth/csrf": { status: 200, body: { csrfToken: "anonymous-token" } },
      "POST /api/auth/login": () => {
        signedIn = true;
        return sessionFor("funder");
      },
    });
    const { router } = renderApp("/report", testRoutes);
    await screen.findByRole("heading", { name: "Sign in" });
    fireEvent.change(screen.getByLabelText("E-mail address"), { target: { value: "robin@example.org" } });
    fireEvent.change(screen.getByLabelText("Password"), { target: { value: "correct horse battery" } });
    fireEvent.click(screen.getByRole("button", { name: "Sign in" }));
    expect(await screen.findByRole("heading", { name: "Quarterly report page" })).toBeTruthy();
    expect(router.state.location.pathname).toBe("/report");
  });

  it("sends the user to sign in, and back afterwards, when the session ends during a change", async () => {
    fakeServer({
      "GET /api/me": sessionFor("instructor"),
      "PATCH /api/me": signedOut,
    });
    const { router } = renderApp("/account");
    fireEvent.click(await screen.findByLabelText(/centimetres/i));
    await screen.findByRole("heading", { name: "Sign in" });
    expect(router.state.location.pathname).toBe("/sign-in");
    expect(new URLSearchParams(router.state.location.search).get("next")).toBe("/account");
  });

  it("opens '/' on each role's first landing page", () => {
    expect(homePathFor("funder", testRoutes)).toBe("/report");
    expect(homePathFor("instructor", testRoutes)).toBe("/account");
  });

  it("never opens '/' on a page that needs an id", () => {
    const withDetail: AppRoute[] = [{ ...testRoutes[0], path: "report/:id", landing: true }, testRoutes[1]];
    expect(homePathFor("funder", withDetail)).toBe("/account");
  });

  it("refuses a 'next' address outside Quarterbeat", async () => {
    fakeServer({ "GET /api/me": sessionFor("instructor") });
    const { router } = renderApp("/sign-in?next=//evil.example/phish", testRoutes);
    await waitFor(() => expect(router.state.location.pathname).toBe("/account"));
  });
});
