import fs from "node:fs";
import path from "node:path";
import type { Command } from "commander";
import { AppError } from "../../server/errors";
import { recordBackup, verifiedMessage } from "../../server/ops/backupLog";
import { copyAndVerify } from "../../server/ops/scheduledBackup";
import { context } from "../context";
import { UsageError } from "../errors";

export function registerBackup(program: Command) {
  program
    .command("backup <file>")
    .description("Write a verified copy of the database with SQLite's online backup (safe while the server runs)")
    .option("--force", "overwrite the file if it exists")
    .action(async (file: string, options: { force?: boolean }, command: Command) => {
      const target = path.resolve(file);
      if (fs.existsSync(target) && !options.force) {
        throw new UsageError(`${file} already exists.`, "Choose another file name or add --force to overwrite it.");
      }
      if (fs.existsSync(target)) fs.rmSync(target);
      fs.mkdirSync(path.dirname(target), { recursive: true });
      const { db, config } = context(command);
      const started = Date.now();
      const takenAt = new Date().toISOString();
      // the same copy and verification as the scheduled backups: one snapshot, integrity check, row counts
      const { problem, tables } = await copyAndVerify(config.dbFile, target);
      const size = fs.existsSync(target) ? fs.statSync(target).size : 0;
      recordBackup(db, { takenAt, file: target, sizeBytes: size, source: "cli", verified: problem === null, message: problem ?? verifiedMessage(tables) });
      if (problem !== null) {
        throw new AppError(
          "backup_failed",
          422,
          `The backup ${file} failed its verification: ${problem}`,
          undefined,
          "Check the disk and the database, then try again; the failure is recorded on the System page.",
        );
      }
      console.log(
        `Backed up ${config.dbFile} to ${file} (${(size / 1024 / 1024).toFixed(1)} MB in ${Date.now() - started} ms), verified: ${verifiedMessage(tables)}`,
      );
      console.log(`To restore: stop the server, then run \`quarterbeat restore ${file} --force\` (or restore into a new file with --db).`);
    });
}
