import type { Command } from "commander";
import { loadConfig } from "../../server/config";
import { restoreDatabase } from "../../server/ops/restore";

export function registerRestore(program: Command) {
  program
    .command("restore <file>")
    .description("Restore a backup into a new or stopped database (--db); the backup is checked first")
    .option("--force", "replace an existing database file (never one a running server holds)")
    .action(async (file: string, options: { force?: boolean }, command: Command) => {
      // Not the shared context: that would open (and so create and migrate) the very file being replaced.
      const globals = command.optsWithGlobals<{ db?: string }>();
      const config = loadConfig(undefined, globals.db ? { dbFile: globals.db } : {});
      const result = await restoreDatabase({ backupFile: file, targetFile: config.dbFile, force: options.force });
      const rows = Object.values(result.tables).reduce((sum, n) => sum + n, 0);
      console.log(
        `${result.replaced ? "Replaced" : "Created"} ${config.dbFile} from ${file}: ${Object.keys(result.tables).length} tables, ${rows} rows, ${result.tables.attempts ?? 0} attempts.`,
      );
      console.log(
        `Schema at migration ${result.migration.applied}${result.migration.current ? "" : ` (the next start applies the newer ones up to ${result.migration.latest})`}.`,
      );
      console.log(`Start the server on it with QUARTERBEAT_DB=${config.dbFile}.`);
    });
}
