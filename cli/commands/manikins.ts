// `quarterbeat manikins --from 2025-Q1 --to 2026-Q4`: each manikin's depth readings against the other manikins
// of the same patient type in the same classes, and which ones to check for sensor drift.
import type { Command } from "commander";
import { z } from "zod";
import { DRIFT_DEFAULTS, driftRule, manikinDriftReport } from "../../server/metrics/manikinDrift";
import { currentPolicy } from "../../server/policy/service";
import { context } from "../context";
import { UsageError } from "../errors";
import { checkQuarterRange } from "../quarterRange";
import { siteIdOfCode } from "../siteCode";

const optionsSchema = z.object({
  from: z.string(),
  to: z.string(),
  site: z.string().optional(),
  minClasses: z.string().optional(),
  minOffset: z.string().optional(),
  json: z.boolean().optional(),
});

function positiveNumber(text: string, option: string, whole: boolean): number {
  const value = Number(text);
  if (!Number.isFinite(value) || value <= 0 || (whole && !Number.isInteger(value))) {
    throw new UsageError(
      `${option} ${text} is not a ${whole ? "whole number" : "number"} above 0.`,
      `For example ${option} ${whole ? DRIFT_DEFAULTS.minClasses : DRIFT_DEFAULTS.minOffsetMm}.`,
    );
  }
  return value;
}

export function registerManikins(program: Command) {
  program
    .command("manikins")
    .description("Manikins whose depth readings differ from their peers' in the same classes (sensor drift)")
    .requiredOption("--from <quarter>", "first quarter, e.g. 2025-Q1")
    .requiredOption("--to <quarter>", "last quarter, e.g. 2026-Q4")
    .option("--site <code>", "one site's manikins (default: the whole fleet)")
    .option("--min-classes <k>", "paired classes needed before a manikin can be flagged (default: the network's setting)")
    .option("--min-offset <mm>", "smallest offset (mm) worth a check (default: the network's setting)")
    .option("--json", "print JSON")
    .action((raw: unknown, command: Command) => {
      const options = optionsSchema.parse(raw);
      checkQuarterRange(options.from, options.to);
      const { db } = context(command);
      const setting = driftRule(currentPolicy(db).policy.equipment);
      const minClasses = options.minClasses === undefined ? setting.minClasses : positiveNumber(options.minClasses, "--min-classes", true);
      const minOffsetMm = options.minOffset === undefined ? setting.minOffsetMm : positiveNumber(options.minOffset, "--min-offset", false);
      const siteId = siteIdOfCode(db, options.site);
      const rows = manikinDriftReport(db, { from: options.from, to: options.to, siteId, options: { minClasses, minOffsetMm } });
      if (options.json) {
        const answer = rows.map(({ differences: _evidence, ...row }) => row);
        return console.log(JSON.stringify(answer, null, 2));
      }
      const mm = (x: number | null) => (x === null ? "–" : `${x >= 0 ? "+" : ""}${x.toFixed(1)} mm`);
      console.log(`Manikins against their peers in the same classes, ${options.from} to ${options.to}`);
      console.log(`Flagged when at least ${minClasses} paired classes, |offset| ≥ ${minOffsetMm} mm and the 95 % interval excludes 0.`);
      if (rows.length === 0) console.log("  No manikin shared a class with another manikin of its patient type.");
      for (const r of rows) {
        const interval = r.ci95 ? ` (95 % interval ${mm(r.ci95[0])} to ${mm(r.ci95[1])})` : "";
        const flag = r.flag === "check" ? `CHECK (flagged in round ${r.flagged_in_round})` : r.flag;
        console.log(
          `  ${r.manikin.padEnd(10)} ${r.profile.padEnd(7)} ${String(r.classes).padStart(4)} classes · offset ${mm(r.offset_mm)}${interval} · ${flag}`,
        );
      }
    });
}
