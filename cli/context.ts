// What every command needs: the validated configuration and the database named by --db.
import type { Command } from "commander";
import { loadConfig, type Config } from "../server/config";
import { openDatabase, type Db } from "../server/db/client";

export interface CliContext {
  config: Config;
  db: Db;
}

let open: CliContext | undefined;

export function context(command: Command): CliContext {
  if (open) return open;
  const globals = command.optsWithGlobals<{ db?: string }>();
  const config = loadConfig(undefined, globals.db ? { dbFile: globals.db } : {});
  open = { config, db: openDatabase(config.dbFile) };
  return open;
}

export function closeContext() {
  open?.db.$client.close();
  open = undefined;
}
