// The built web client the journeys run against. A fresh clone has no dist/client, so the first journey
// builds it (once per run); later journeys find it there.
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

export const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../../..");

/** QB_E2E_CLIENT_DIR points at another build (for example while dist/ is being rebuilt by someone else). */
export async function builtClientDir(): Promise<string> {
  const override = process.env.QB_E2E_CLIENT_DIR;
  if (override) {
    if (!fs.existsSync(path.join(override, "index.html"))) throw new Error(`QB_E2E_CLIENT_DIR=${override} holds no index.html`);
    return override;
  }
  const clientDir = path.join(repoRoot, "dist/client");
  if (!fs.existsSync(path.join(clientDir, "index.html"))) {
    const { build } = await import("vite");
    await build({ root: repoRoot, configFile: path.join(repoRoot, "vite.config.ts"), logLevel: "warn" });
  }
  return clientDir;
}
