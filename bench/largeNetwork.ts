// Writes the large invented network the insight and load benchmarks use (500 instructors at 25 sites, eight
// quarters 2024-Q1 … 2025-Q4, 125,000 attempts a quarter: 1 million at scale 1) to a file, once, so later runs
// can reuse it: QB_BENCH_LARGE_DB=<file> for the insight benchmark, QB_LOAD_DB=<file> QB_LOAD_QUARTER=2025-Q4
// for the load benchmark. The file has no user accounts; the benchmarks add their own.
//
// Run: npx tsx bench/largeNetwork.ts <file> [scale]   (scale 1 → 1 M attempts, about 1 GB, 6–11 min here)
import fs from "node:fs";
import { generateNetwork, largeNetworkSize } from "../tests/fixtures/insight/generateNetwork";

const [file, scaleText = "1"] = process.argv.slice(2);
const scale = Number(scaleText);
if (!file || !(scale > 0)) {
  console.error("usage: npx tsx bench/largeNetwork.ts <file> [scale]");
  process.exit(2);
}
if (fs.existsSync(file)) {
  console.error(`${file} exists; give a new file name.`);
  process.exit(2);
}
const started = performance.now();
const { db, attempts } = generateNetwork(file, largeNetworkSize(scale));
db.$client.close();
console.log(`${attempts.toLocaleString("en")} attempts written to ${file} in ${((performance.now() - started) / 1000).toFixed(0)} s`);
