import { cleanup, fireEvent, screen, waitFor } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { wrongCredentialsMessage } from "../../src/features/auth/SignInPage";
import { renderApp } from "./renderApp";
import { fakeServer, signedOut } from "./testServer";

// Rendering with role queries in jsdom is slow on a busy machine; allow for it.
vi.setConfig({ testTimeout: 20_000 });

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

function fill(email: string, password: string) {
  fireEvent.change(screen.getByLabelText("E-mail address"), { target: { value: email } });
  fireEvent.change(screen.getByLabelText("Password"), { target: { value: password } });
  fireEvent.click(screen.getByRole("button", { name: "Sign in" }));
}

describe("sign-in form", () => {
  it("shows the shared schema's messages beside empty fields and sends nothing", async () => {
    const server = fakeServer({ "GET /api/me": signedOut });
    renderApp("/sign-in");
    await screen.findByRole("heading", { name: "Sign in" });
    fireEvent.click(screen.getByRole("button", { name: "Sign in" }));

    const email = screen.getByLabelText("E-mail address");
    const password = screen.getByLabelText("Password");
    // Messages from shared/schemas/auth.ts, tied to their fields for screen readers (validation settles a tick later).
    await waitFor(() => expect(email.getAttribute("aria-invalid")).toBe("true"));
    expect(document.getElementById(email.getAttribute("aria-describedby")!)?.textContent).toBe("Enter an e-mail address such as name@example.org");
    expect(document.getElementById(password.getAttribute("aria-describedby")!)?.textContent).toBe("Enter your password");
    expect(document.activeElement).toBe(email);
    expect(server.requests.filter((r) => r.method === "POST")).toHaveLength(0);
  });

  it("clears a message as soon as the field becomes valid", async () => {
    fakeServer({ "GET /api/me": signedOut });
    renderApp("/sign-in");
    await screen.findByRole("heading", { name: "Sign in" });
    fill("not-an-address", "");
    expect(await screen.findByText("Enter an e-mail address such as name@example.org")).toBeTruthy();
    fireEvent.change(screen.getByLabelText("E-mail address"), { target: { value: "robin@example.org" } });
    await waitFor(() => expect(screen.queryByText("Enter an e-mail address such as name@example.org")).toBeNull());
    expect(screen.getByText("Enter your password")).toBeTruthy();
  });

  it("shows one generic message for wrong credentials, and sends the CSRF token with the login", async () => {
    const server = fakeServer({
      "GET /api/me": signedOut,
      "GET /api/auth/csrf": { status: 200, body: { csrfToken: "anonymous-token" } },
      "POST /api/auth/login": { status: 401, body: { error: { code: "invalid_credentials", message: "Unknown e-mail robin@example.org" } } },
    });
    renderApp("/sign-in");
    await screen.findByRole("heading", { name: "Sign in" });
    fill("robin@example.org", "wrong password");
    expect((await screen.findByRole("alert")).textContent).toContain(wrongCredentialsMessage);
    expect(screen.queryByText(/Unknown e-mail/)).toBeNull();
    const login = server.requests.find((r) => r.path === "/api/auth/login")!;
    expect(login.headers["x-csrf-token"]).toBe("anonymous-token");
    expect(login.body).toEqual({ email: "robin@example.org", password: "wrong password" });
  });

  it("says clearly when sign-in is paused after too many attempts", async () => {
    fakeServer({
      "GET /api/me": signedOut,
      "GET /api/auth/csrf": { status: 200, body: { csrfToken: "anonymous-token" } },
      "POST /api/auth/login": { status: 429, body: { error: { code: "rate_limited", message: "Too many requests" } } },
    });
    renderApp("/sign-in");
    await screen.findByRole("heading", { name: "Sign in" });
    fill("robin@example.org", "another try");
    expect((await screen.findByRole("alert")).textContent).toMatch(/Too many sign-in attempts.*wait a few minutes/i);
  });
});
