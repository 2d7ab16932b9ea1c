// Registers the commands; each lives in cli/commands/<name>.ts and ends in the one error handler.
import { Command } from "commander";
import { registerActions } from "./commands/actions";
import { registerBackup } from "./commands/backup";
import { registerDb } from "./commands/db";
import { registerDemo } from "./commands/demo";
import { registerUsers } from "./commands/users";
import { registerImport } from "./commands/import";
import { registerAnalyze } from "./commands/analyze";
import { registerStats } from "./commands/stats";
import { registerReport } from "./commands/report";
import { registerRetention } from "./commands/retention";
import { registerAgreement } from "./commands/agreement";
import { registerFunnel } from "./commands/funnel";
import { registerManikins } from "./commands/manikins";
import { registerRestore } from "./commands/restore";
import { registerSystem } from "./commands/system";
import { registerTrend } from "./commands/trend";
import { APP_VERSION } from "../server/ops/version";
import { closeContext } from "./context";
import { handleError } from "./errors";

export function buildProgram(): Command {
  const program = new Command("quarterbeat")
    .description("Quarterbeat: CPR training quality for a network of instructors")
    .version(APP_VERSION, "-V, --version", "print the program's version")
    .option("--db <file>", "SQLite database file (default: $QUARTERBEAT_DB, then data/quarterbeat.sqlite)")
    .exitOverride()
    .showHelpAfterError("(run with --help for usage)");
  registerDb(program);
  registerBackup(program);
  registerRestore(program);
  registerSystem(program);
  registerDemo(program);
  registerUsers(program);
  registerImport(program);
  registerAnalyze(program);
  registerStats(program);
  registerReport(program);
  registerRetention(program);
  registerAgreement(program);
  registerManikins(program);
  registerFunnel(program);
  registerTrend(program);
  registerActions(program);
  return program;
}

export async function run(argv: string[]): Promise<number> {
  try {
    await buildProgram().parseAsync(argv);
    return 0;
  } catch (err) {
    return handleError(err);
  } finally {
    closeContext();
  }
}
