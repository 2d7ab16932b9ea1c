// `npm run bench`: runs every benchmark in turn. Each prints its own table of figures and ratios against a
// baseline measured in the same run; none of them fails a build.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

const here = path.dirname(fileURLToPath(import.meta.url));
const only = process.argv[2];
const benches = fs
  .readdirSync(here)
  .filter((f) => f.endsWith(".bench.ts"))
  .filter((f) => !only || f.startsWith(only))
  .sort();

for (const file of benches) {
  console.log(`\n=== ${file} ===`);
  const result = spawnSync(process.execPath, ["--import", "tsx", "--expose-gc", path.join(here, file)], { stdio: "inherit" });
  if (result.status !== 0) console.log(`(${file} exited with ${result.status})`);
}
