// After the run: the temporary folder of the served database goes (the server stops right after).
import fs from "node:fs";

export default function removeServedDatabase() {
  const dir = process.env.QB_E2E_DIR;
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
}
