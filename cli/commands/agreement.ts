// `quarterbeat agreement --quarter 2026-Q3 --by instructor`: each instructor's judgement against the
// measurement — how often they passed measured failures (lenient) or failed measured passes (strict).
import type { Command } from "commander";
import { z } from "zod";
import { isQuarter } from "../../shared/period";
import { calibrationByInstructor } from "../../server/metrics/calibration";
import { context } from "../context";
import { UsageError } from "../errors";

const optionsSchema = z.object({ quarter: z.string(), by: z.string(), json: z.boolean().optional() });

export function registerAgreement(program: Command) {
  program
    .command("agreement")
    .description("Instructors' pass/fail against the measurement, one row per instructor")
    .requiredOption("--quarter <quarter>", "the quarter, e.g. 2026-Q3")
    .option("--by <grouping>", "what to group by (instructor)", "instructor")
    .option("--json", "print JSON")
    .action((raw: unknown, command: Command) => {
      const options = optionsSchema.parse(raw);
      if (!isQuarter(options.quarter)) throw new UsageError(`"${options.quarter}" is not a quarter.`, "Use the form 2026-Q3.");
      if (options.by !== "instructor") throw new UsageError(`--by ${options.by} is not a grouping agreement knows.`, "Use --by instructor.");
      const rows = calibrationByInstructor(context(command).db, options.quarter);
      if (options.json) return console.log(JSON.stringify(rows, null, 2));
      const pct = (x: number | null) => (x === null ? "–" : `${(x * 100).toFixed(1)} %`);
      console.log(`Instructors' judgement against the measurement, ${options.quarter}`);
      for (const r of rows) {
        console.log(
          `  ${r.instructor.padEnd(8)} ${String(r.judged).padStart(5)} judged · passed ${pct(r.lenient_share)} of measured failures · failed ${pct(r.strict_share)} of measured passes · kappa ${r.kappa === null ? "–" : r.kappa.toFixed(3)}`,
        );
      }
    });
}
