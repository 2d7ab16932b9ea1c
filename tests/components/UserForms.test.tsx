import { QueryClientProvider } from "@tanstack/react-query";
import { cleanup, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { instructorListAnswerSchema } from "../../shared/schemas/sites";
import type { UserRow } from "../../shared/schemas/users";
import { setCsrfToken } from "../../src/api/http";
import { createQueryClient } from "../../src/app/queryClient";
import { AddUserForm, EditUserForm } from "../../src/features/users/UserForms";
import { answer, fakeServer } from "./testServer";

// Rendering with role queries in jsdom is slow on a busy machine; allow for it.
vi.setConfig({ testTimeout: 20_000 });

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const instructors = answer(instructorListAnswerSchema, {
  instructors: [{ id: 4, code: "IN-04", name: "Robin Example", siteId: 1, siteCode: "NORTH-1", active: true }],
});

const funder: UserRow = {
  id: 12,
  email: "sam@example.org",
  displayName: "Sam Example",
  role: "funder",
  instructorId: null,
  instructorCode: null,
  active: true,
  createdAt: "2026-01-05T10:00:00.000Z",
};

function renderWithClient(ui: React.ReactNode) {
  setCsrfToken("token");
  render(<QueryClientProvider client={createQueryClient()}>{ui}</QueryClientProvider>);
}

describe("user forms", () => {
  it("asks for a linked instructor only for the instructor role, with the shared schema's message", async () => {
    const server = fakeServer({ "GET /api/instructors": instructors });
    renderWithClient(<AddUserForm onDone={() => {}} onCancel={() => {}} />);
    expect(screen.queryByLabelText("Linked instructor")).toBeNull();
    fireEvent.change(screen.getByLabelText("E-mail address"), { target: { value: "robin@example.org" } });
    fireEvent.change(screen.getByLabelText("Display name"), { target: { value: "Robin Example" } });
    fireEvent.change(screen.getByLabelText("Role"), { target: { value: "instructor" } });
    fireEvent.change(screen.getByLabelText("Initial password"), { target: { value: "long enough password" } });
    fireEvent.click(screen.getByRole("button", { name: "Add user" }));
    // Message from shared/schemas/users.ts
    expect(await screen.findByText("An instructor account must be linked to an instructor")).toBeTruthy();
    expect(server.requests.filter((r) => r.method === "POST")).toHaveLength(0);
  });

  it("drops the instructor link when the role changes away from instructor, in the same change", async () => {
    const server = fakeServer({
      "GET /api/instructors": instructors,
      "PATCH /api/users/12": { status: 200, body: { user: { ...funder, role: "quality_lead" } } },
    });
    const onDone = vi.fn();
    renderWithClient(<EditUserForm user={funder} isSelf={false} onDone={onDone} onCancel={() => {}} />);
    fireEvent.change(screen.getByLabelText("Role"), { target: { value: "instructor" } });
    await screen.findByRole("option", { name: /IN-04/ });
    fireEvent.change(screen.getByLabelText("Linked instructor"), { target: { value: "4" } });
    fireEvent.change(screen.getByLabelText("Role"), { target: { value: "quality_lead" } });
    expect((screen.getByLabelText("Role") as HTMLSelectElement).value).toBe("quality_lead");
    expect(screen.queryByLabelText("Linked instructor")).toBeNull();
    fireEvent.click(screen.getByRole("button", { name: "Save changes" }));
    await waitFor(() => expect(onDone).toHaveBeenCalled());
    // Only what changed is sent; the link stays empty.
    expect(server.requests.find((r) => r.method === "PATCH")?.body).toEqual({ role: "quality_lead" });
  });

  it("shows the server's field message beside the field", async () => {
    fakeServer({
      "GET /api/instructors": instructors,
      "POST /api/users": {
        status: 409,
        body: { error: { code: "conflict", message: "That e-mail is already in use.", details: [{ path: "email", message: "Already in use" }] } },
      },
    });
    renderWithClient(<AddUserForm onDone={() => {}} onCancel={() => {}} />);
    fireEvent.change(screen.getByLabelText("E-mail address"), { target: { value: "sam@example.org" } });
    fireEvent.change(screen.getByLabelText("Display name"), { target: { value: "Sam" } });
    fireEvent.change(screen.getByLabelText("Role"), { target: { value: "funder" } });
    fireEvent.change(screen.getByLabelText("Initial password"), { target: { value: "long enough password" } });
    fireEvent.click(screen.getByRole("button", { name: "Add user" }));
    expect(await screen.findByText("Already in use")).toBeTruthy();
    expect(screen.getByRole("alert").textContent).toContain("That e-mail is already in use.");
    const email = screen.getByLabelText("E-mail address");
    expect(email.getAttribute("aria-invalid")).toBe("true");
  });
});
