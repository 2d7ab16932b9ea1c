import { run } from "./index";

// Output piped into a program that stops reading (`| head`) is not an error of ours: end quietly.
process.stdout.on("error", (error: NodeJS.ErrnoException) => {
  if (error.code === "EPIPE") process.exit(0);
  throw error;
});

process.exitCode = await run(process.argv);
