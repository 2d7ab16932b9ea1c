// Every command ends here: print what went wrong and what to do next, and set the exit code
// (0 ok, 1 refused input, 2 usage).
import { CommanderError } from "commander";
import { ZodError } from "zod";
import { AppError } from "../server/errors";
import { debugOutputWanted } from "../server/config";

export const EXIT_OK = 0;
export const EXIT_REFUSED = 1;
export const EXIT_USAGE = 2;

export class UsageError extends Error {
  constructor(
    message: string,
    readonly hint?: string,
  ) {
    super(message);
  }
}

export function handleError(err: unknown): number {
  if (err instanceof CommanderError) {
    // commander has already printed its message
    return err.exitCode === 0 ? EXIT_OK : EXIT_USAGE;
  }
  if (err instanceof UsageError) {
    printProblem(err.message, err.hint ?? "Run with --help to see the command's options.");
    return EXIT_USAGE;
  }
  if (err instanceof ZodError) {
    const lines = err.issues.map((issue) => `${issue.path.join(".") || "value"}: ${issue.message}`);
    printProblem(`Invalid option:\n  ${lines.join("\n  ")}`, "Run with --help to see the command's options.");
    return EXIT_USAGE;
  }
  if (err instanceof AppError) {
    const details = Array.isArray(err.details)
      ? err.details.map((d: { path?: string; message?: string }) => `  ${d.path ? `${d.path}: ` : ""}${d.message ?? JSON.stringify(d)}`)
      : [];
    printProblem([err.message, ...details].join("\n"), err.hint);
    return EXIT_REFUSED;
  }
  const message = err instanceof Error ? err.message : String(err);
  printProblem(message, "If this keeps happening, run again with QUARTERBEAT_DEBUG=1 and report the output.");
  if (debugOutputWanted() && err instanceof Error) console.error(err.stack);
  return EXIT_REFUSED;
}

function printProblem(message: string, hint?: string) {
  console.error(`quarterbeat: ${message}`);
  if (hint) console.error(`  → ${hint}`);
}
