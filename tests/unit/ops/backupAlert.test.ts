// Backup alerts go to the active coordinators only, and a mail failure is logged, never thrown.
import { Writable } from "node:stream";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../../server/db/client";
import { createLogger } from "../../../server/logging/logger";
import type { Mailer, OutgoingMail } from "../../../server/mail/mailer";
import { alertCoordinators } from "../../../server/ops/backupAlert";
import { makeTestDb, seedPeople } from "../../helpers/testApp";

let db: Db;
beforeAll(async () => {
  db = makeTestDb();
  await seedPeople(db);
});
afterAll(() => db.$client.close());

function fakeMailer(fail = false) {
  const sent: OutgoingMail[] = [];
  const mailer = {
    target: "smtp://test",
    send: async (mail: OutgoingMail) => {
      if (fail) throw new Error("connect ECONNREFUSED");
      sent.push(mail);
      return { messageId: "m1", accepted: mail.to, rejected: [] };
    },
  } as unknown as Mailer;
  return { sent, mailer };
}

function capture() {
  const lines: Record<string, unknown>[] = [];
  const stream = new Writable({ write: (chunk, _e, done) => (lines.push(JSON.parse(chunk.toString())), done()) });
  return { lines, logger: createLogger({ logLevel: "info", nodeEnv: "test" }, stream) };
}

describe("backup alerts", () => {
  it("e-mails the coordinators what failed and what to do", async () => {
    const { sent, mailer } = fakeMailer();
    const { lines, logger } = capture();
    await alertCoordinators(db, mailer, logger, {
      kind: "failed",
      file: "/srv/backups/quarterbeat-2026-03-01T030000Z.sqlite",
      at: "2026-03-01T03:00:00.000Z",
      problem: "disk full",
    });
    expect(sent).toHaveLength(1);
    expect(sent[0].to).toEqual(["coord@test.example"]);
    expect(sent[0].subject).toBe("Quarterbeat: a backup failed");
    expect(sent[0].text).toContain("The scheduled backup of 2026-03-01T03:00:00.000Z failed: disk full");
    expect(sent[0].text).toContain("quarterbeat-2026-03-01T030000Z.sqlite was not kept");
    expect(lines).toEqual([expect.objectContaining({ event: "backup_alert", kind: "failed", recipients: 1 })]);
  });

  it("logs a mail failure instead of throwing it", async () => {
    const { mailer } = fakeMailer(true);
    const { lines, logger } = capture();
    await alertCoordinators(db, mailer, logger, { kind: "missed", lastBackupAt: "2026-02-27T03:00:00.000Z", at: "2026-03-01T12:00:00.000Z" });
    expect(lines).toEqual([expect.objectContaining({ level: 50, event: "backup_alert", kind: "missed", error: "connect ECONNREFUSED" })]);
  });
});
