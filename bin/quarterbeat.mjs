#!/usr/bin/env node
// The installed command. In production (NODE_ENV=production) it runs the CLI compiled by `npm run build` when
// present; otherwise the TypeScript CLI through tsx, so the installed command and `npm run cli` are the same code.
import fs from "node:fs";
import { fileURLToPath } from "node:url";

const compiled = new URL("../dist/server/cli.js", import.meta.url);
if (process.env.NODE_ENV === "production" && fs.existsSync(fileURLToPath(compiled))) {
  await import(compiled.href);
} else {
  const { register } = await import("tsx/esm/api");
  register();
  await import("../cli/main.ts");
}
