// The `quarterbeat` CLI as a person runs it: a fresh Node with tsx, no QUARTERBEAT_DB from the environment.
import { spawnSync } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../..");

export function cli(args: string[], input?: string) {
  const result = spawnSync(process.execPath, ["--import", "tsx", path.join(root, "cli/main.ts"), ...args], {
    cwd: root,
    input,
    encoding: "utf8",
    env: { ...process.env, QUARTERBEAT_DB: "" },
  });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}
