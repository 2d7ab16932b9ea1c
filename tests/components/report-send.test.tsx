import { QueryClientProvider } from "@tanstack/react-query";
import { cleanup, configure, fireEvent, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import type { ReportSendRow, ReportVersion } from "../../shared/schemas/report";
import { userListAnswerSchema } from "../../shared/schemas/users";
import { setCsrfToken } from "../../src/api/http";
import { createQueryClient } from "../../src/app/queryClient";
import { parseExtraAddresses } from "../../src/features/report/extraAddresses";
import { SendForm } from "../../src/features/report/SendForm";
import { renderApp } from "./renderApp";
import { answer, fakeServer, sessionFor } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 15_000 });
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const version: ReportVersion = {
  id: 4,
  period: "2026-Q3",
  version: 2,
  createdAt: "2026-10-02T09:00:00.000Z",
  createdBy: "Robin Example",
  pdfBytes: 19_445,
  lastSend: null,
  releasedAt: "2026-10-02T09:30:00.000Z",
};

const users = answer(userListAnswerSchema, {
  users: [
    {
      id: 2,
      email: "funder@example.org",
      displayName: "Fran Funder",
      role: "funder",
      instructorId: null,
      instructorCode: null,
      active: true,
      createdAt: "2026-01-01",
    },
    {
      id: 3,
      email: "old-funder@example.org",
      displayName: "Old Funder",
      role: "funder",
      instructorId: null,
      instructorCode: null,
      active: false,
      createdAt: "2026-01-01",
    },
  ],
});

function renderForm() {
  setCsrfToken("token-1");
  return render(
    <QueryClientProvider client={createQueryClient()}>
      <SendForm period="2026-Q3" versions={[version]} />
    </QueryClientProvider>,
  );
}

const coverNote = "Dear funders,\nour third-quarter report is attached.";

describe("send to funders", () => {
  it("asks for a cover note beside the field and goes no further without one", async () => {
    const server = fakeServer({ "GET /api/users": users });
    renderForm();
    expect(await screen.findByText("funder@example.org")).toBeTruthy();
    fireEvent.change(screen.getByRole("textbox", { name: /Cover note/ }), { target: { value: "   " } });
    fireEvent.click(screen.getByRole("button", { name: "Review before sending" }));

    const note = screen.getByRole("textbox", { name: /Cover note/ });
    expect(note.getAttribute("aria-invalid")).toBe("true");
    const message = document.getElementById(note.getAttribute("aria-describedby")!.split(" ")[0])!;
    expect(message.textContent).toBe("Write a cover note for the funders");
    expect(document.activeElement).toBe(note);
    expect(screen.queryByRole("heading", { name: /Check before sending/ })).toBeNull();
    expect(server.requests.filter((r) => r.method === "POST")).toHaveLength(0);
  });

  it("refuses an invalid extra address beside the field and sends nothing", async () => {
    const server = fakeServer({ "GET /api/users": users });
    renderForm();
    expect(await screen.findByText("funder@example.org")).toBeTruthy(); // active funders only
    expect(screen.queryByText(/old-funder/)).toBeNull();

    fireEvent.change(screen.getByRole("textbox", { name: /Cover note/ }), { target: { value: coverNote } });
    const extra = screen.getByRole("textbox", { name: /Extra addresses/ });
    fireEvent.change(extra, { target: { value: "board@example.org, treasurer(at)example.org" } });
    fireEvent.click(screen.getByRole("button", { name: "Review before sending" }));

    expect(extra.getAttribute("aria-invalid")).toBe("true");
    const message = document.getElementById(extra.getAttribute("aria-describedby")!.split(" ")[0])!;
    expect(message.textContent).toBe("“treasurer(at)example.org” is not an e-mail address. Use the form name@example.org.");
    expect(document.activeElement).toBe(extra);
    expect(server.requests.filter((r) => r.method === "POST")).toHaveLength(0);
  });

  it("shows the exact PDF, the note, the period and every recipient before anything is sent, and sends on confirmation", async () => {
    const sent: ReportSendRow = {
      id: 1,
      reportId: 4,
      period: "2026-Q3",
      version: 2,
      sentBy: "Robin Example",
      recipients: ["funder@example.org", "board@example.org"],
      delivered: ["funder@example.org", "board@example.org"],
      coverNote,
      status: "sent",
      error: null,
      messageId: "<1@localhost>",
      createdAt: "2026-10-02T09:05:00.000Z",
    };
    const server = fakeServer({ "GET /api/users": users, "POST /api/reports/4/send": { status: 201, body: { send: sent } } });
    renderForm();
    expect(await screen.findByText("funder@example.org")).toBeTruthy();
    fireEvent.change(screen.getByRole("textbox", { name: /Cover note/ }), { target: { value: `  ${coverNote} ` } });
    fireEvent.change(screen.getByRole("textbox", { name: /Extra addresses/ }), { target: { value: " Board@Example.org;\nboard@example.org " } });
    fireEvent.click(screen.getByRole("button", { name: "Review before sending" }));

    const heading = screen.getByRole("heading", { name: "Check before sending: 2026 Q3, version 2" });
    expect(document.activeElement).toBe(heading);
    const recipients = screen.getByRole("list", { name: "Recipients" });
    expect([...recipients.querySelectorAll("li")].map((li) => li.textContent)).toEqual(["funder@example.org", "board@example.org"]);
    expect(screen.getByText(/each in a message of their own/)).toBeTruthy();
    expect(screen.getByText((_, el) => el?.tagName === "BLOCKQUOTE" && el.textContent === coverNote)).toBeTruthy();
    const frame = screen.getByTitle("PDF of 2026 Q3, version 2, as it will be attached");
    expect(frame.getAttribute("src")).toBe("/api/reports/4/pdf?inline=1");
    expect(screen.getByRole("link", { name: "Download the PDF of version 2" }).getAttribute("href")).toBe("/api/reports/4/pdf");
    expect(server.requests.filter((r) => r.method === "POST")).toHaveLength(0);

    fireEvent.click(screen.getByRole("button", { name: "Send to 2 recipients" }));
    expect(await screen.findByText("Version 2 of 2026 Q3 was sent to funder@example.org, board@example.org, one message each.")).toBeTruthy();
    const post = server.requests.find((r) => r.method === "POST")!;
    expect(post.path).toBe("/api/reports/4/send");
    expect(post.body).toEqual({ coverNote, extraRecipients: ["board@example.org"] });
  });

  it("warns when the version to send was stored without the text on what the network is doing", async () => {
    const data = { hasData: true, errors: { rows: [], attemptsWithErrors: { value: 0, hidden: null, text: "0" }, actions: "  " } };
    fakeServer({ "GET /api/users": users, "GET /api/reports/4/data": { status: 200, body: { report: version, data } } });
    renderForm();
    expect(await screen.findByText("funder@example.org")).toBeTruthy();
    fireEvent.change(screen.getByRole("textbox", { name: /Cover note/ }), { target: { value: coverNote } });
    fireEvent.click(screen.getByRole("button", { name: "Review before sending" }));
    expect(await screen.findByText(/This version was stored before you wrote what the network is doing about the errors/)).toBeTruthy();
  });

  it("goes back to the form with everything kept, and sends nothing", async () => {
    const server = fakeServer({ "GET /api/users": users });
    renderForm();
    expect(await screen.findByText("funder@example.org")).toBeTruthy();
    fireEvent.change(screen.getByRole("textbox", { name: /Cover note/ }), { target: { value: coverNote } });
    fireEvent.click(screen.getByRole("button", { name: "Review before sending" }));
    fireEvent.click(screen.getByRole("button", { name: "Back to editing" }));
    expect((screen.getByRole("textbox", { name: /Cover note/ }) as HTMLTextAreaElement).value).toBe(coverNote);
    expect(screen.queryByRole("heading", { name: /Check before sending/ })).toBeNull();
    expect(server.requests.filter((r) => r.method === "POST")).toHaveLength(0);
  });

  it("reads addresses separated by commas, semicolons, spaces or lines, and caps them at 20", () => {
    expect(parseExtraAddresses("")).toEqual({ ok: true, addresses: [] });
    expect(parseExtraAddresses("a@example.org b@example.org;c@example.org\nd@example.org")).toEqual({
      ok: true,
      addresses: ["a@example.org", "b@example.org", "c@example.org", "d@example.org"],
    });
    expect(parseExtraAddresses("a@example.org, nope, also@")).toEqual({
      ok: false,
      message: "“nope”, “also@” are not e-mail addresses. Use the form name@example.org.",
    });
    const many = Array.from({ length: 21 }, (_, i) => `p${i}@example.org`).join(",");
    expect(parseExtraAddresses(many)).toEqual({ ok: false, message: "Send to at most 20 extra addresses at once" });
  });
});

describe("report page", () => {
  it("offers funders the latest released version's stored PDF and none of the coordinator's tools", async () => {
    const released = [version, { ...version, id: 3, version: 1 }];
    const server = fakeServer({
      "GET /api/me": sessionFor("funder"),
      "GET /api/reports": { status: 200, body: { reports: released } },
      "GET /api/reports?period=2026-Q3": { status: 200, body: { reports: released } },
      "GET /api/reports/4/data": { status: 404, body: { error: { code: "not_found", message: "The report was not found." } } },
    });
    renderApp("/report?period=2026-Q3");
    const link = await screen.findByRole("link", { name: /Download PDF/ });
    expect(link.getAttribute("href")).toBe("/api/reports/4/pdf");
    expect(link.textContent).toContain("version 2");
    // The funder reads the stored version; here it fails, and the page says so instead of showing nothing.
    expect(await screen.findByText("The report could not be loaded")).toBeTruthy();
    expect(screen.getByText("The report was not found.")).toBeTruthy();
    expect(screen.queryByRole("button", { name: "Create report version" })).toBeNull();
    expect(screen.queryByRole("heading", { name: "Prepare and send" })).toBeNull();
    expect(server.requests.some((r) => r.path === "/api/report-sends")).toBe(false);
    // no "today's figures" for funders: they read what was released to them
    expect(screen.queryByRole("radio", { name: "Today's figures" })).toBeNull();
    expect(server.requests.some((r) => r.path.includes("/preview"))).toBe(false);
  });

  it("tells a funder when no report has been released yet, and opens on no period", async () => {
    const server = fakeServer({ "GET /api/me": sessionFor("funder"), "GET /api/reports": { status: 200, body: { reports: [] } } });
    renderApp("/report");
    expect(await screen.findByText("No report has been released yet")).toBeTruthy();
    expect(screen.queryByRole("link", { name: /Download PDF/ })).toBeNull();
    expect(server.requests.some((r) => r.path.startsWith("/api/reports?period="))).toBe(false);
  });
});
