// The folder holding package.json, drizzle/ and dist/client. Found by walking up from this module, so the same
// code works from source (server/) and compiled into one bundle (dist/server/), whose depths differ.
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

export function findProjectRoot(start: string): string {
  for (let dir = start; ; dir = path.dirname(dir)) {
    if (fs.existsSync(path.join(dir, "package.json")) && fs.existsSync(path.join(dir, "drizzle"))) return dir;
    if (path.dirname(dir) === dir) throw new Error(`Quarterbeat's folder (package.json beside drizzle/) was not found above ${start}.`);
  }
}

export const projectRoot = findProjectRoot(path.dirname(fileURLToPath(import.meta.url)));
