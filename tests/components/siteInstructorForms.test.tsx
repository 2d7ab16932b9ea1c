import { QueryClientProvider } from "@tanstack/react-query";
import { cleanup, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { siteListAnswerSchema } from "../../shared/schemas/sites";
import { setCsrfToken } from "../../src/api/http";
import { createQueryClient } from "../../src/app/queryClient";
import { AddInstructorForm } from "../../src/features/instructors/InstructorForms";
import { AddSiteForm } from "../../src/features/sites/SiteForms";
import { answer, fakeServer } from "./testServer";

// Rendering with role queries in jsdom is slow on a busy machine; allow for it.
vi.setConfig({ testTimeout: 20_000 });

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const site = { id: 3, code: "NORTH-1", name: "North Hall", active: true, instructors: 0, manikins: 0 };

function renderWithClient(ui: React.ReactNode) {
  setCsrfToken("token");
  render(<QueryClientProvider client={createQueryClient()}>{ui}</QueryClientProvider>);
}

describe("site and instructor forms", () => {
  it("checks a site with the shared schema, then shows the server's message beside the code", async () => {
    const server = fakeServer({
      "POST /api/sites": {
        status: 409,
        body: { error: { code: "conflict", message: "A site with the code NORTH-1 already exists.", details: [{ path: "code", message: "Already in use" }] } },
      },
    });
    renderWithClient(<AddSiteForm onDone={() => {}} onCancel={() => {}} />);
    fireEvent.change(screen.getByLabelText("Site code"), { target: { value: "north 1" } });
    fireEvent.click(screen.getByRole("button", { name: "Add site" }));
    // Messages from shared/schemas/sites.ts
    expect(await screen.findByText("Use 1–32 letters, digits, '.', '_' or '-'")).toBeTruthy();
    expect(screen.getByText("Enter the site's name")).toBeTruthy();
    expect(server.requests.filter((r) => r.method === "POST")).toHaveLength(0);

    fireEvent.change(screen.getByLabelText("Site code"), { target: { value: " NORTH-1 " } });
    fireEvent.change(screen.getByLabelText("Site name"), { target: { value: "North Hall" } });
    fireEvent.click(screen.getByRole("button", { name: "Add site" }));
    expect(await screen.findByText("Already in use")).toBeTruthy();
    expect(screen.getByRole("alert").textContent).toContain("A site with the code NORTH-1 already exists.");
    expect(screen.getByLabelText("Site code").getAttribute("aria-invalid")).toBe("true");
    // The schema's output is sent: the code trimmed.
    expect(server.requests.find((r) => r.method === "POST")?.body).toEqual({ code: "NORTH-1", name: "North Hall" });
  });

  it("sends the chosen site as a number", async () => {
    const created = { id: 9, code: "IN-09", name: "Kim Example", siteId: 3, siteCode: "NORTH-1", active: true };
    const server = fakeServer({
      "GET /api/sites": answer(siteListAnswerSchema, { sites: [site] }),
      "POST /api/instructors": { status: 201, body: { instructor: created } },
    });
    const onDone = vi.fn();
    renderWithClient(<AddInstructorForm onDone={onDone} onCancel={() => {}} />);
    fireEvent.change(screen.getByLabelText("Instructor code"), { target: { value: "IN-09" } });
    fireEvent.change(screen.getByLabelText("Name"), { target: { value: "Kim Example" } });
    await screen.findByRole("option", { name: /NORTH-1/ });
    fireEvent.change(screen.getByLabelText("Site"), { target: { value: "3" } });
    expect((screen.getByLabelText("Site") as HTMLSelectElement).value).toBe("3");
    fireEvent.click(screen.getByRole("button", { name: "Add instructor" }));
    await waitFor(() => expect(onDone).toHaveBeenCalledWith(created));
    expect(server.requests.find((r) => r.method === "POST")?.body).toEqual({ code: "IN-09", name: "Kim Example", siteId: 3 });
  });
});
