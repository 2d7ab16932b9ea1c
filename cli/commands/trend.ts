// `quarterbeat trend --from 2025-Q1 --to 2026-Q4 --by month`: the run chart of the measured pass rate, one
// point per calendar month of the class date, with its median and the run-chart rules (Anhøj & Olesen 2014)
// — the chart the action detail page draws, from the same service. Rates are fractions.
import type { Command } from "commander";
import { z } from "zod";
import { isQuarter } from "../../shared/period";
import { patientTypes, type PatientType } from "../../shared/scoring/policy";
import { figureNames } from "../../shared/vocabulary";
import { monthlyRunChart } from "../../server/metrics/monthlyRunChart";
import { context } from "../context";
import { UsageError } from "../errors";
import { checkQuarterRange } from "../quarterRange";
import { siteIdOfCode } from "../siteCode";

const optionsSchema = z.object({
  from: z.string(),
  to: z.string(),
  site: z.string().optional(),
  profile: z.string().optional(),
  by: z.string(),
  baselineTo: z.string().optional(),
  json: z.boolean().optional(),
});

function profileOf(text: string | undefined): PatientType | null {
  if (text === undefined) return null;
  if (!(patientTypes as readonly string[]).includes(text))
    throw new UsageError(`--profile ${text} is not a patient type.`, `Use one of ${patientTypes.join(", ")}.`);
  return text as PatientType;
}

export function registerTrend(program: Command) {
  program
    .command("trend")
    .description("Run chart of the measured pass rate by month, with its median and the run-chart signals")
    .requiredOption("--from <quarter>", "first quarter, e.g. 2025-Q1")
    .requiredOption("--to <quarter>", "last quarter, e.g. 2026-Q4")
    .option("--site <code>", "one site (default: the whole network)")
    .option("--profile <type>", `one patient type: ${patientTypes.join(", ")}`)
    .option("--by <period>", "the points' period (month)", "month")
    .option("--baseline-to <quarter>", "take the median over the months up to this quarter only")
    .option("--json", "print JSON")
    .action((raw: unknown, command: Command) => {
      const options = optionsSchema.parse(raw);
      if (options.by !== "month")
        throw new UsageError(`--by ${options.by} is not supported.`, "Use --by month (quarters are on the Overview page and in `quarterbeat stats`).");
      checkQuarterRange(options.from, options.to);
      const profile = profileOf(options.profile);
      const baselineTo = options.baselineTo;
      if (baselineTo !== undefined) {
        if (!isQuarter(baselineTo)) throw new UsageError(`--baseline-to "${baselineTo}" is not a quarter.`, "Use the form 2026-Q3.");
        if (baselineTo < options.from || baselineTo > options.to)
          throw new UsageError(`--baseline-to ${baselineTo} lies outside ${options.from} to ${options.to}.`, "Name a quarter of the range.");
      }
      const { db } = context(command);
      const siteId = siteIdOfCode(db, options.site);
      const chart = monthlyRunChart(db, { from: options.from, to: options.to, siteId, instructorId: null, profile }, { baselineTo });
      if (baselineTo !== undefined && chart.baseline === null) {
        throw new UsageError(`No month up to ${baselineTo} has attempts, so there is no baseline median.`, "Name a later --baseline-to, or leave it out.");
      }
      const answer = {
        from: options.from,
        to: options.to,
        site: options.site ?? null,
        profile,
        by: "month",
        baseline_to: baselineTo ?? null,
        points: chart.points.map((point) => ({ period: point.period, n: point.n, passed: point.x, rate: point.rate })),
        median: chart.median,
        useful: chart.useful,
        longest_run: chart.longestRun,
        longest_run_limit: chart.longestRunLimit,
        crossings: chart.crossings,
        crossings_limit: chart.crossingsLimit,
        signal: chart.signal,
      };
      if (options.json) return console.log(JSON.stringify(answer, null, 2));

      const pct = (x: number | null) => (x === null ? "–" : `${(x * 100).toFixed(1)} %`);
      const scope = [options.site ?? "whole network", profile ?? "every patient type"].join(" · ");
      console.log(`${figureNames.passRate} by month, ${options.from} to ${options.to} (${scope})`);
      if (answer.points.length === 0) return console.log("  No month of this range has attempts.");
      for (const point of answer.points) {
        const side = answer.median === null || point.rate === answer.median ? "on the median" : point.rate > answer.median ? "above" : "below";
        console.log(
          `  ${point.period}  ${String(point.n).padStart(6)} attempts · ${String(point.passed).padStart(6)} passed · ${pct(point.rate).padStart(7)} · ${side}`,
        );
      }
      console.log(`  median ${pct(answer.median)}${baselineTo ? ` (months up to ${baselineTo})` : ""} · ${answer.useful} points off the median`);
      const limit = (x: number | null) => (x === null ? "–" : String(x));
      console.log(
        `  longest run ${answer.longest_run} (a shift needs more than ${limit(answer.longest_run_limit)}) · crossings ${answer.crossings} (a shift needs fewer than ${limit(answer.crossings_limit)})`,
      );
      console.log(answer.signal ? "  Signal: the months show a non-random shift." : "  No signal: the months vary around the median as chance would.");
    });
}
