// The alert choice on the account page and the Alerts page, against the fake server.
import { cleanup, configure, fireEvent, screen, waitFor, within } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { alertKindLabels } from "../../shared/alertKinds";
import { renderApp } from "./renderApp";
import { alertChoiceAnswerSchema, allAlertsAnswerSchema, myAlertsAnswerSchema, type AlertChoice, type AlertDelivery } from "../../shared/schemas/alerts";
import { dataVersionAnswerSchema } from "../../shared/schemas/dataVersion";
import { answer, fakeServer, sessionFor, type FakeAnswer } from "./testServer";

vi.setConfig({ testTimeout: 30_000 });
configure({ asyncUtilTimeout: 15_000 });
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const version = answer(dataVersionAnswerSchema, { version: "run:1:0" });

describe("alerts after each import on my account", () => {
  it("shows the current choice, saves the boxes ticked and says so", async () => {
    const server = fakeServer({
      "GET /api/me": sessionFor("instructor"),
      "GET /api/data-version": version,
      "GET /api/me/alerts": answer(alertChoiceAnswerSchema, { kinds: ["service", "drift"], isDefault: true }),
      "PUT /api/me/alerts": (request) => answer(alertChoiceAnswerSchema, { kinds: (request.body as AlertChoice).kinds, isDefault: false }),
    });
    renderApp("/account");
    const section = within((await screen.findByRole("heading", { name: "Alerts after each import" })).closest("section")!);
    const service = await section.findByRole("checkbox", { name: alertKindLabels.service });
    expect((service as HTMLInputElement).checked).toBe(true);
    expect((section.getByRole("checkbox", { name: alertKindLabels.drift }) as HTMLInputElement).checked).toBe(true);
    const shift = section.getByRole("checkbox", { name: alertKindLabels.shift }) as HTMLInputElement;
    expect(shift.checked).toBe(false);
    // each box is described by its one-line explanation
    expect(shift.getAttribute("aria-describedby")).toBe("alert-kind-shift");
    expect(section.getByText("Only signals about you and your own site reach you.")).toBeTruthy();
    expect(section.getByText("These are your role's usual alerts until you save a choice.")).toBeTruthy();

    fireEvent.click(shift);
    fireEvent.click(service);
    fireEvent.click(section.getByRole("button", { name: "Save alert choice" }));
    expect(await section.findByText("Saved. The next digest follows this choice.")).toBeTruthy();
    const put = server.requests.find((r) => r.method === "PUT");
    expect(put?.body).toEqual({ kinds: ["shift", "drift"] });
    expect(put?.headers["x-csrf-token"] ?? put?.headers["X-CSRF-Token"]).toBeTruthy();
  });

  it("shows the server's refusal and no success", async () => {
    const refused: FakeAnswer = {
      status: 422,
      body: {
        error: {
          code: "validation_failed",
          message: "The alert choice is not valid.",
          details: [{ path: "kinds.0", message: "Choose from funnel, shift, service, drift, noData" }],
        },
      },
    };
    fakeServer({
      "GET /api/me": sessionFor("coordinator"),
      "GET /api/data-version": version,
      "GET /api/me/alerts": answer(alertChoiceAnswerSchema, { kinds: ["funnel"], isDefault: false }),
      "PUT /api/me/alerts": refused,
    });
    renderApp("/account");
    const button = await screen.findByRole("button", { name: "Save alert choice" });
    expect(screen.queryByText("Only signals about you and your own site reach you.")).toBeNull();
    expect(screen.queryByText("These are your role's usual alerts until you save a choice.")).toBeNull();
    fireEvent.click(button);
    expect(await screen.findByText("The alert choice is not valid.")).toBeTruthy();
    expect(screen.queryByText("Saved. The next digest follows this choice.")).toBeNull();
  });

  it("is not offered to a funder", async () => {
    const server = fakeServer({ "GET /api/me": sessionFor("funder"), "GET /api/data-version": version });
    renderApp("/account");
    await screen.findByRole("heading", { name: "Change password" });
    expect(screen.queryByRole("heading", { name: "Alerts after each import" })).toBeNull();
    expect(server.requests.some((r) => r.path === "/api/me/alerts")).toBe(false);
  });
});

const delivery: AlertDelivery = {
  key: "service:MK-7:service_by_days:never",
  kind: "service",
  summary: "MK-7 (NORTH) due for service: 400 days since it came into use",
  sentAt: "2026-11-02T08:00:00.000Z",
  link: { label: "Manikin MK-7", path: "/equipment/manikins/MK-7" },
};

describe("the Alerts page", () => {
  it("lists the reader's alerts with a link to the page behind each", async () => {
    fakeServer({
      "GET /api/me": sessionFor("instructor"),
      "GET /api/data-version": version,
      "GET /api/alerts": answer(myAlertsAnswerSchema, { deliveries: [delivery] }),
    });
    renderApp("/alerts");
    // the table and, for phones, its cards
    const links = await screen.findAllByRole("link", { name: "Manikin MK-7" });
    expect(links.map((link) => link.getAttribute("href"))).toContain("/equipment/manikins/MK-7");
    expect(screen.getAllByText(delivery.summary).length).toBeGreaterThan(0);
    expect(screen.queryByRole("button", { name: "All users' alerts" })).toBeNull();
  });

  it("lets a coordinator switch to every user's alerts, with how many people each went to", async () => {
    const server = fakeServer({
      "GET /api/me": sessionFor("coordinator"),
      "GET /api/data-version": version,
      "GET /api/alerts": answer(myAlertsAnswerSchema, { deliveries: [] }),
      "GET /api/alerts/all": answer(allAlertsAnswerSchema, { signals: [{ ...delivery, recipients: 3 }] }),
    });
    renderApp("/alerts");
    fireEvent.click(await screen.findByRole("button", { name: "All users' alerts" }));
    const table = await screen.findByRole("table", { name: "Alerts mailed to every user" });
    expect(within(table).getByRole("columnheader", { name: /People/ })).toBeTruthy();
    await waitFor(() => expect(within(table).getByText("3")).toBeTruthy());
    expect(server.requests.some((r) => r.path === "/api/alerts/all")).toBe(true);
  });
});
