// Tells the coordinators by e-mail when a scheduled backup failed or a day went by without one, so that a
// network does not find out on the day it needs a restore.
import path from "node:path";
import type { Db } from "../db/client";
import type { Logger } from "../logging/logger";
import type { Mailer, OutgoingMail } from "../mail/mailer";
import { activeAddresses } from "../users/service";

export type BackupProblem = { kind: "failed"; file: string; at: string; problem: string } | { kind: "missed"; lastBackupAt: string; at: string };

export function backupAlertMessage(problem: BackupProblem, to: string[]): OutgoingMail {
  const text =
    problem.kind === "failed"
      ? [
          `The scheduled backup of ${problem.at} failed: ${problem.problem}`,
          "",
          `The copy ${path.basename(problem.file)} was not kept, and no older backup was deleted.`,
          "Check the disk and the backup folder, then take a copy by hand with `quarterbeat backup FILE`.",
        ]
      : [
          `No backup was taken between ${problem.lastBackupAt} and ${problem.at}: the server was not running at the backup hour.`,
          "",
          "A backup has been started now; the server log says whether it was verified.",
        ];
  return { to, subject: problem.kind === "failed" ? "Quarterbeat: a backup failed" : "Quarterbeat: a backup was missed", text: text.join("\n") };
}

/** Sends the alert; a mail failure is logged, never thrown (the schedule must go on). */
export async function alertCoordinators(db: Db, mailer: Mailer, logger: Logger, problem: BackupProblem): Promise<void> {
  const to = activeAddresses(db, "coordinator");
  if (to.length === 0) return;
  try {
    await mailer.send(backupAlertMessage(problem, to));
    logger.info({ event: "backup_alert", kind: problem.kind, recipients: to.length }, "backup alert sent");
  } catch (err) {
    logger.error({ event: "backup_alert", kind: problem.kind, recipients: to.length, error: (err as Error).message }, "backup alert could not be sent");
  }
}
