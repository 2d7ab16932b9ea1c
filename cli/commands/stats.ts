// `quarterbeat stats --quarter 2026-Q3`: the quarter's network summary (the service the web statistics use).
import type { Command } from "commander";
import { z } from "zod";
import { isQuarter } from "../../shared/quarter";
import { quarterSummary } from "../../server/stats/quarterSummary";
import { context } from "../context";
import { UsageError } from "../errors";

const optionsSchema = z.object({ quarter: z.string(), json: z.boolean().optional() });

export function registerStats(program: Command) {
  program
    .command("stats")
    .description("Summary of one quarter: classes, attempts, pass rates, medians, errors, feedback, agreement")
    .requiredOption("--quarter <quarter>", "the quarter, e.g. 2026-Q3")
    .option("--json", "print JSON")
    .action((raw: unknown, command: Command) => {
      const options = optionsSchema.parse(raw);
      if (!isQuarter(options.quarter)) throw new UsageError(`"${options.quarter}" is not a quarter.`, "Use the form 2026-Q3.");
      const s = quarterSummary(context(command).db, options.quarter);
      if (options.json) return console.log(JSON.stringify(s, null, 2));
      const pct = (x: number | null) => (x === null ? "–" : `${(x * 100).toFixed(1)} %`);
      const num = (x: number | null) => (x === null ? "–" : x.toFixed(1));
      console.log(`Quarter ${s.quarter}`);
      console.log(`  classes ${s.classes} · learners ${s.learners} · instructors ${s.instructors} · sites ${s.sites}`);
      console.log(`  course completion (class logs): ${pct(s.course_pass_rate)}`);
      const ci = s.pass_rate_ci95 ? ` (95 % CI ${pct(s.pass_rate_ci95[0])} – ${pct(s.pass_rate_ci95[1])})` : "";
      console.log(`  attempts ${s.attempts} · passed ${s.passed} · pass rate ${pct(s.pass_rate)}${ci}`);
      console.log(
        `  medians: score ${num(s.median.score)} · depth ok ${num(s.median.depth_ok_pct)} % · rate ok ${num(s.median.rate_ok_pct)} % · recoil ok ${num(s.median.recoil_ok_pct)} % · hands-on ${num(s.median.hands_on_pct)} %`,
      );
      console.log(`  errors: ${Object.entries(s.errors).map(([name, count]) => `${name} ${count}`).join(" · ")}`);
      console.log(
        `  live feedback: ${s.by_feedback.live.attempts} attempts, pass rate ${pct(s.by_feedback.live.pass_rate)} · hidden: ${s.by_feedback.hidden.attempts} attempts, pass rate ${pct(s.by_feedback.hidden.pass_rate)}`,
      );
      console.log(`  instructor vs Quarterbeat: ${s.agreement.attempts} attempts judged by both, kappa ${s.agreement.kappa === null ? "–" : s.agreement.kappa.toFixed(3)}`);
    });
}
