// Creating a funder report version: the coordinator chooses whether it lists the improvement actions, and the
// request says so.
import { QueryClientProvider } from "@tanstack/react-query";
import { cleanup, fireEvent, render, screen, waitFor } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { setCsrfToken } from "../../src/api/http";
import { createQueryClient } from "../../src/app/queryClient";
import { VersionsPanel } from "../../src/features/report/VersionsPanel";
import { fakeServer } from "./testServer";

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const version = {
  id: 4,
  period: "2026-Q3",
  version: 1,
  createdAt: "2026-10-02T09:00:00.000Z",
  createdBy: "Robin Example",
  pdfBytes: 20_480,
  lastSend: null,
  releasedAt: null,
};

function renderPanel() {
  const server = fakeServer({ "POST /api/reports/2026-Q3": { status: 201, body: { report: version } } });
  setCsrfToken("token");
  render(
    <QueryClientProvider client={createQueryClient()}>
      <VersionsPanel period="2026-Q3" versions={[]} onCreated={() => undefined} />
    </QueryClientProvider>,
  );
  return server;
}

describe("the improvement actions option of a report version", () => {
  it("leaves the actions out unless the box is ticked", async () => {
    const server = renderPanel();
    expect((screen.getByRole("checkbox", { name: /Include the improvement actions/ }) as HTMLInputElement).checked).toBe(false);
    fireEvent.click(screen.getByRole("button", { name: "Create report version" }));
    await waitFor(() => expect(server.requests.some((r) => r.method === "POST")).toBe(true));
    expect(server.requests.find((r) => r.method === "POST")?.body).toEqual({ includeActions: false });
  });

  it("asks for them when ticked", async () => {
    const server = renderPanel();
    fireEvent.click(screen.getByRole("checkbox", { name: /Include the improvement actions/ }));
    fireEvent.click(screen.getByRole("button", { name: "Create report version" }));
    await waitFor(() => expect(server.requests.some((r) => r.method === "POST")).toBe(true));
    expect(server.requests.find((r) => r.method === "POST")?.body).toEqual({ includeActions: true });
  });
});
