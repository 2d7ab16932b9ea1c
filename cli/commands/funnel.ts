// `quarterbeat funnel --quarter 2026-Q3 --adjust case-mix`: every instructor's passes against those expected,
// the z-score and the funnel flag, with the dispersion φ — what the instructors page answers, from the same
// service. Rates are fractions.
import type { Command } from "commander";
import { z } from "zod";
import { adjustParamSchema, insightFiltersSchema } from "../../shared/filters";
import { rangeLabel } from "../../shared/period";
import { adjustNames } from "../../shared/vocabulary";
import { resolvePeriod } from "../../server/insight/filters";
import { instructorTable } from "../../server/insight/instructors";
import { context } from "../context";
import { UsageError } from "../errors";

const optionsSchema = z.object({
  quarter: z.string().optional(),
  from: z.string().optional(),
  to: z.string().optional(),
  adjust: z.string(),
  json: z.boolean().optional(),
});

export function registerFunnel(program: Command) {
  program
    .command("funnel")
    .description("Instructors against the network: passes expected, z-scores, funnel flags and overdispersion")
    .option("--quarter <quarter>", "one quarter, e.g. 2026-Q3 (default: the latest with attempts)")
    .option("--from <quarter>", "first quarter of a range")
    .option("--to <quarter>", "last quarter of a range")
    .option("--adjust <mode>", "case-mix (patient type × feedback display) or none", "case-mix")
    .option("--json", "print JSON")
    .action((raw: unknown, command: Command) => {
      const options = optionsSchema.parse(raw);
      const period = insightFiltersSchema.safeParse({ quarter: options.quarter, from: options.from, to: options.to });
      if (!period.success) {
        const issue = period.error.issues[0];
        throw new UsageError(`--${issue.path.join(".")}: ${issue.message}.`, "Give --quarter 2026-Q3, or --from and --to.");
      }
      const adjust = adjustParamSchema.safeParse(options.adjust);
      if (!adjust.success) throw new UsageError(`--adjust ${options.adjust} is not a way of comparing instructors.`, "Use --adjust case-mix or --adjust none.");

      const db = context(command).db;
      const resolved = resolvePeriod(db, period.data);
      const answer = instructorTable(db, { period: resolved, siteId: null, profile: null, feedback: null, instructorId: null, manikinId: null }, adjust.data);
      const result = {
        period: { from: resolved.from, to: resolved.to },
        adjust: adjust.data,
        network_rate: answer.funnel.networkRate,
        phi: answer.funnel.phi,
        overdispersed: answer.funnel.overdispersed,
        limits_scale: answer.funnel.scale,
        instructors: answer.instructors.map((row) => ({
          instructor: row.code,
          attempts: row.attempts,
          passed: row.passRate.successes ?? 0,
          expected: row.expected,
          z: row.z,
          flag: row.position,
        })),
      };
      if (options.json) return console.log(JSON.stringify(result, null, 2));

      const pct = (x: number | null) => (x === null ? "–" : `${(x * 100).toFixed(1)} %`);
      const fixed = (x: number | null, digits: number) => (x === null ? "–" : x.toFixed(digits));
      console.log(`Instructors against the network, ${rangeLabel(resolved)} · ${adjustNames[adjust.data].toLowerCase()}`);
      console.log(
        `  network pass rate ${pct(result.network_rate)} · dispersion φ ${fixed(result.phi, 2)} · ${result.overdispersed ? `overdispersed: limits widened by √φ = ${result.limits_scale.toFixed(2)}` : "not overdispersed: plain limits"}`,
      );
      for (const row of result.instructors) {
        console.log(
          `  ${row.instructor.padEnd(8)} ${String(row.attempts).padStart(5)} attempts · ${String(row.passed).padStart(5)} passed · ${fixed(row.expected, 1).padStart(7)} expected · z ${fixed(row.z, 2).padStart(6)} · ${row.flag ?? "–"}`,
        );
      }
    });
}
