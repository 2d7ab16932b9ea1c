import { cleanup, configure, fireEvent, screen, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import type { OutboxMessage } from "../../shared/schemas/report";
import { renderApp } from "./renderApp";
import { fakeServer, sessionFor } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 15_000 });
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const message: OutboxMessage = {
  id: 12,
  receivedAt: "2026-10-02T09:05:00.000Z",
  from: "quarterbeat@localhost",
  recipients: ["funder@example.org", "board@example.org"],
  subject: "Example network: training quality report for July–September 2026 (2026-Q3)",
  text: "Dear funder,\n\nAttached is the training quality report.",
  attachments: [{ index: 0, filename: "quarterbeat-funder-report-2026-Q3-v2.pdf", contentType: "application/pdf", size: 19_445 }],
};

describe("outbox", () => {
  it("lists received mail, opens one to read its text and download its PDF", async () => {
    fakeServer({ "GET /api/me": sessionFor("coordinator"), "GET /api/outbox": { status: 200, body: { messages: [message] } } });
    const { router } = renderApp("/outbox");
    expect(await screen.findByText(/While no mail server is set up, Quarterbeat keeps outgoing mail here instead of sending it/)).toBeTruthy();
    const table = await screen.findByRole("table");
    expect(within(table).getByText("funder@example.org, board@example.org")).toBeTruthy();

    fireEvent.click(within(table).getByRole("button", { name: message.subject }));
    const article = await screen.findByRole("article");
    expect(router.state.location.search).toBe("?message=12");
    expect(within(article).getByRole("heading", { level: 2 }).textContent).toBe(message.subject);
    expect(document.activeElement).toBe(within(article).getByRole("heading", { level: 2 }));
    expect(within(article).getByText(/Attached is the training quality report\./)).toBeTruthy();
    const download = within(article).getByRole("link", { name: "Download quarterbeat-funder-report-2026-Q3-v2.pdf" });
    expect(download.getAttribute("href")).toBe("/api/outbox/12/attachment/0");

    fireEvent.click(within(article).getByRole("button", { name: "Close message" }));
    expect(screen.queryByRole("article")).toBeNull();
  });

  it("says so when nothing has been received, and when the list cannot be loaded", async () => {
    fakeServer({ "GET /api/me": sessionFor("coordinator"), "GET /api/outbox": { status: 200, body: { messages: [] } } });
    renderApp("/outbox");
    expect(await screen.findByText("The outbox is empty")).toBeTruthy();
    cleanup();
    fakeServer({
      "GET /api/me": sessionFor("coordinator"),
      "GET /api/outbox": { status: 403, body: { error: { code: "forbidden", message: "Your role does not allow this." } } },
    });
    renderApp("/outbox");
    expect(await screen.findByText("The outbox could not be loaded")).toBeTruthy();
    expect(screen.getByText("Your role does not allow this.")).toBeTruthy();
  });
});
