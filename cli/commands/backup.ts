import fs from "node:fs";
import path from "node:path";
import type { Command } from "commander";
import { context } from "../context";
import { UsageError } from "../errors";

export function registerBackup(program: Command) {
  program
    .command("backup <file>")
    .description("Write a consistent copy of the database with SQLite's online backup (safe while the server runs)")
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
      await db.$client.backup(target);
      const size = fs.statSync(target).size;
      console.log(`Backed up ${config.dbFile} to ${file} (${(size / 1024 / 1024).toFixed(1)} MB in ${Date.now() - started} ms).`);
      console.log(`To restore: stop the server, then run \`quarterbeat restore ${file} --force\` (or restore into a new file with --db).`);
    });
}
