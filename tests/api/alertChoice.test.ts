// Each user's alerts: the choice of kinds (GET and PUT /api/me/alerts), the digest each user gets (only the
// kinds they chose, an instructor only about themselves and their own site), and the history of what was
// mailed (GET /api/alerts for one's own, GET /api/alerts/all for a coordinator).
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { alertKinds } from "../../shared/alertKinds";
import { alertChoiceAnswerSchema, allAlertsAnswerSchema, myAlertsAnswerSchema } from "../../shared/schemas/alerts";
import { allAlerts } from "../../server/alerts/history";
import { sendImportAlerts } from "../../server/alerts/importAlerts";
import { currentSignals } from "../../server/alerts/signals";
import type { Db } from "../../server/db/client";
import { alertDeliveries, mailbox, users } from "../../server/db/schema";
import { startLocalMailService, type LocalMailService } from "../../server/mail/localService";
import { createMailer } from "../../server/mail/mailer";
import { createInstructor, createSite } from "../../server/sites/service";
import { quarterOf } from "../../shared/period";
import { insertClass, type Spec } from "../fixtures/insight/network";
import { seedShiftNetwork } from "../fixtures/alerts/shiftNetwork";
import { makeTestApp, makeTestDb, signIn, type Agent, type TestApp } from "../helpers/testApp";

const AS_OF = "2026-07-01";

function mailTo(db: Db, email: string) {
  return db
    .select({ recipients: mailbox.recipients, subject: mailbox.subject, text: mailbox.text })
    .from(mailbox)
    .all()
    .filter((m) => m.recipients.includes(email));
}

describe("alerts per user", () => {
  let db: Db;
  let app: TestApp;
  let mail: LocalMailService;
  let coordinator: Agent;
  let qualityLead: Agent;
  let northInstructor: Agent;
  let southInstructor: Agent;
  let funder: Agent;
  let everyCode: string[];

  beforeAll(async () => {
    db = makeTestDb();
    const people = await seedShiftNetwork(db);
    // 2026-05: ten instructors at HUB pass 10 of 20 each and E3 (EAST) passes 60 of 60, far above everyone
    // else in 2026-Q2, so the funnel has a signal about an instructor other than A1 and B1
    const hub = createSite(db, { code: "HUB", name: "Hubbard Centre" });
    const pass: Spec = ["pass", 80];
    const fail: Spec = ["shallow", 70];
    const addClass = (code: string, siteId: number, specs: Spec[]) => {
      const instructor = createInstructor(db, { code, name: `Instructor ${code}`, siteId });
      insertClass(db, {
        id: `${code}-2605`,
        date: "2026-05-20",
        quarter: quarterOf("2026-05-20"),
        siteId,
        instructorId: instructor.id,
        course: "adult",
        profile: "adult",
        learners: specs.length,
        passed: 0,
        manikinId: 1,
        attempts: specs.map((spec) => ({ spec, feedback: "live" as const })),
      });
    };
    const hubCodes = Array.from({ length: 10 }, (_, i) => `H${i + 1}`);
    for (const code of hubCodes) addClass(code, hub.id, [...Array<Spec>(10).fill(pass), ...Array<Spec>(10).fill(fail)]);
    addClass("E3", people.sites.east.id, Array<Spec>(60).fill(pass));
    everyCode = ["A1", "B1", "N2", "N3", "N4", "E1", "E2", "E3", "W1", ...hubCodes];
    mail = await startLocalMailService(db, { port: 0 });
    app = makeTestApp(db);
    [coordinator, qualityLead, northInstructor, southInstructor, funder] = await Promise.all(
      ["coord@test.example", "quality@test.example", "a1@test.example", "b1@test.example", "funder@test.example"].map((email) => signIn(app, email)),
    );
  });
  afterAll(async () => {
    await mail.close();
    db.$client.close();
  });

  it("answers each role's defaults until the user chooses", async () => {
    expect(alertChoiceAnswerSchema.parse((await coordinator.get("/api/me/alerts").expect(200)).body)).toEqual({ kinds: [...alertKinds], isDefault: true });
    expect((await qualityLead.get("/api/me/alerts").expect(200)).body).toEqual({ kinds: [...alertKinds], isDefault: true });
    expect((await northInstructor.get("/api/me/alerts").expect(200)).body).toEqual({ kinds: ["service", "drift"], isDefault: true });
    await funder.get("/api/me/alerts").expect(403);
    await funder.put("/api/me/alerts", { kinds: ["funnel"] }).expect(403);
  });

  it("refuses an unknown kind, a kind named twice, a body without kinds and kinds that are not a list, and keeps the choice as it was", async () => {
    const unknown = await northInstructor.put("/api/me/alerts", { kinds: ["funnel", "weather"] }).expect(422);
    expect(unknown.body.error.details).toEqual([expect.objectContaining({ path: "kinds.1", message: expect.stringContaining("Choose from funnel, shift") })]);
    await northInstructor.put("/api/me/alerts", { kinds: ["funnel", "funnel"] }).expect(422);
    await northInstructor.put("/api/me/alerts", {}).expect(422);
    await northInstructor.put("/api/me/alerts", { kinds: "funnel" }).expect(422);
    expect((await northInstructor.get("/api/me/alerts").expect(200)).body).toEqual({ kinds: ["service", "drift"], isDefault: true });
  });

  it("needs the CSRF token to save a choice", async () => {
    await northInstructor.agent.put("/api/me/alerts").send({ kinds: [] }).expect(403);
  });

  it("keeps a saved choice, in the kinds' own order", async () => {
    const saved = await northInstructor.put("/api/me/alerts", { kinds: ["noData", "funnel", "shift", "drift", "service"] }).expect(200);
    expect(saved.body).toEqual({ kinds: ["funnel", "shift", "service", "drift", "noData"], isDefault: false });
    expect((await northInstructor.get("/api/me/alerts").expect(200)).body).toEqual({ kinds: [...alertKinds], isDefault: false });
    await southInstructor.put("/api/me/alerts", { kinds: [...alertKinds] }).expect(200);
    // the quality lead wants nothing: no message at all, not an empty one
    await qualityLead.put("/api/me/alerts", { kinds: [] }).expect(200);
  });

  it("mails each user only the kinds they chose and, to an instructor, nothing about another instructor or site", async () => {
    const signals = currentSignals(db, AS_OF);
    const otherFunnel = signals.funnel.filter((s) => s.instructorCode !== "A1");
    expect(otherFunnel.length).toBeGreaterThan(0);
    expect(signals.shift.map((s) => s.key)).toContain("shift:NORTH:below:2025-11");
    expect(signals.noData.map((s) => s.key)).toEqual(["no-data:SOUTH:2026-Q2"]);

    expect(await sendImportAlerts(db, createMailer(mail.url), AS_OF)).toMatchObject({ status: "sent", recipients: 3 });

    const [toCoordinator] = mailTo(db, "coord@test.example");
    for (const s of otherFunnel) expect(toCoordinator.text).toContain(`- ${s.instructorCode}: ${s.side} the limits`);
    expect(toCoordinator.text).toContain("- SOUTH: check whether its files are still to come.");
    expect(mailTo(db, "quality@test.example")).toEqual([]);
    expect(mailTo(db, "funder@test.example")).toEqual([]);

    const northMail = mailTo(db, "a1@test.example");
    expect(northMail).toHaveLength(1);
    expect(northMail[0].text).toContain("- Site NORTH: below its median in 8 months from November 2025");
    // not the network's months, not SOUTH's quiet quarter, no other instructor's code
    expect(northMail[0].text).not.toMatch(/The network|SOUTH|EAST/);
    for (const code of everyCode.filter((c) => c !== "A1")) expect(northMail[0].text).not.toMatch(new RegExp(`\\b${code}\\b`));

    const southMail = mailTo(db, "b1@test.example");
    expect(southMail).toHaveLength(1);
    expect(southMail[0].text).toContain("- SOUTH: check whether its files are still to come.");
    expect(southMail[0].text).not.toMatch(/NORTH|EAST|MK-SHIFT/);
    for (const code of everyCode.filter((c) => c !== "B1")) expect(southMail[0].text).not.toMatch(new RegExp(`\\b${code}\\b`));
  });

  it("lists each user's own deliveries, newest first, with links they may open", async () => {
    const north = myAlertsAnswerSchema.parse((await northInstructor.get("/api/alerts").expect(200)).body).deliveries;
    expect(north.map((d) => d.key)).toContain("shift:NORTH:below:2025-11");
    expect(north.map((d) => d.sentAt)).toEqual(
      north
        .map((d) => d.sentAt)
        .sort()
        .reverse(),
    );
    expect(north.every((d) => !d.key.includes("SOUTH") && !d.key.includes("network"))).toBe(true);
    expect(north.find((d) => d.kind === "shift")!.link).toEqual({ label: "Network overview", path: "/overview?site=NORTH" });
    const south = myAlertsAnswerSchema.parse((await southInstructor.get("/api/alerts").expect(200)).body).deliveries;
    expect(south.map((d) => d.key)).toEqual(["no-data:SOUTH:2026-Q2"]);
    expect(south[0].summary).toBe("Site SOUTH: no attempts or class logs in 2026 Q2, after some in 2026 Q1");
    expect((await qualityLead.get("/api/alerts").expect(200)).body).toEqual({ deliveries: [] });
    const mine = myAlertsAnswerSchema.parse((await coordinator.get("/api/alerts").expect(200)).body).deliveries;
    const funnel = mine.find((d) => d.kind === "funnel")!;
    expect(funnel.link?.path).toMatch(/^\/instructors\/\d+$/);
    expect(mine.find((d) => d.kind === "noData")!.link).toEqual({ label: "Quarter tracker", path: "/tracker" });
  });

  it("shows a coordinator every signal once with how many people it went to; no one else", async () => {
    await qualityLead.get("/api/alerts/all").expect(403);
    await northInstructor.get("/api/alerts/all").expect(403);
    const all = allAlertsAnswerSchema.parse((await coordinator.get("/api/alerts/all").expect(200)).body).signals;
    expect(all.find((s) => s.key === "no-data:SOUTH:2026-Q2")).toMatchObject({ recipients: 2, link: { path: "/tracker" } });
    expect(all.find((s) => s.key === "shift:NORTH:below:2025-11")).toMatchObject({ recipients: 2 });
    expect(all.find((s) => s.key === "shift:network:below:2025-11")).toMatchObject({ recipients: 1 });
    expect(new Set(all.map((s) => s.key)).size).toBe(all.length);
  });

  it("mails a kind turned on later with the signals of it that still hold, once", async () => {
    await qualityLead.put("/api/me/alerts", { kinds: ["noData"] }).expect(200);
    expect(await sendImportAlerts(db, createMailer(mail.url), AS_OF)).toEqual({ status: "sent", recipients: 1, signals: 1 });
    const [toQuality] = mailTo(db, "quality@test.example");
    expect(toQuality.subject).toBe("Quarterbeat: 1 new signal after the latest import");
    expect(await sendImportAlerts(db, createMailer(mail.url), AS_OF)).toEqual({ status: "nothing-new" });
  });
  it("lists the 500 signals that went out last, newest first, when more are stored", () => {
    const coordinatorId = db.select({ id: users.id }).from(users).where(eq(users.role, "coordinator")).get()!.id;
    const stamp = (i: number) => `2027-01-01T00:${String(Math.floor(i / 60)).padStart(2, "0")}:${String(i % 60).padStart(2, "0")}.000Z`;
    db.insert(alertDeliveries)
      .values(
        Array.from({ length: 510 }, (_, i) => ({ userId: coordinatorId, key: `test:${i}`, kind: "noData" as const, summary: `signal ${i}`, sentAt: stamp(i) })),
      )
      .run();
    const signals = allAlerts(db).signals;
    expect(signals).toHaveLength(500);
    expect(signals[0].key).toBe("test:509");
    expect(signals[499].key).toBe("test:10");
  });
});
