// `quarterbeat stats --quarter 2026-Q3`: the quarter's network summary (the service the web statistics use).
import type { Command } from "commander";
import { z } from "zod";
import { isQuarter } from "../../shared/period";
import { quarterSummary } from "../../server/stats/quarterSummary";
import { attemptErrorNames } from "../../shared/scoring/scoreAttempt";
import { errorShortNames, feedbackNames, figureNames } from "../../shared/vocabulary";
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
      const ci = s.pass_rate_ci95 ? ` (95 % interval ${pct(s.pass_rate_ci95[0])} – ${pct(s.pass_rate_ci95[1])})` : "";
      console.log(`  attempts ${s.attempts} · passed ${s.passed} · ${figureNames.passRate.toLowerCase()} ${pct(s.pass_rate)}${ci}`);
      if (s.change) {
        const points = (x: number) => `${x >= 0 ? "+" : "−"}${Math.abs(x * 100).toFixed(1)}`;
        console.log(
          `  against ${s.change.from}: ${points(s.change.difference)} points (95 % interval ${points(s.change.ci95[0])} to ${points(s.change.ci95[1])}): ${s.change.verdict}`,
        );
      }
      console.log(
        `  learners measured ${s.learners_measured} · passed on their first attempt ${pct(s.first_attempt_pass_rate)} · passed at least once ${pct(s.ever_passed_rate)} · ${num(s.attempts_per_learner)} attempts each`,
      );
      console.log(`  ${figureNames.recordedCompletion.toLowerCase()} (class logs, compare with "passed at least once"): ${pct(s.course_pass_rate)}`);
      console.log(
        `  medians: score ${num(s.median.score)} · depth ok ${num(s.median.depth_ok_pct)} % · rate ok ${num(s.median.rate_ok_pct)} % · recoil ok ${num(s.median.recoil_ok_pct)} % · hands-on ${num(s.median.hands_on_pct)} %`,
      );
      for (const [column, figures] of Object.entries(s.at_ceiling)) {
        console.log(
          `  ${column.replace(/_/g, " ")}: median at 100 %, so: ${pct(figures.share_at_100)} of attempts at 100 %, 10th percentile ${num(figures.p10)} %`,
        );
      }
      console.log(`  errors: ${attemptErrorNames.map((name) => `${errorShortNames[name].toLowerCase()} ${s.errors[name]}`).join(" · ")}`);
      console.log(
        `  ${feedbackNames.live.toLowerCase()}: ${s.by_feedback.live.attempts} attempts, pass rate ${pct(s.by_feedback.live.pass_rate)} · ${feedbackNames.hidden.toLowerCase()}: ${s.by_feedback.hidden.attempts} attempts, pass rate ${pct(s.by_feedback.hidden.pass_rate)}`,
      );
      const a = s.agreement;
      const kappaCi = a.kappa_ci95 ? ` (95 % interval ${a.kappa_ci95[0].toFixed(3)} – ${a.kappa_ci95[1].toFixed(3)})` : "";
      console.log(
        `  ${figureNames.agreement.toLowerCase()}: ${a.attempts} attempts judged by both, kappa ${a.kappa === null ? "–" : a.kappa.toFixed(3)}${kappaCi}`,
      );
      console.log(
        `    instructors passed ${a.table.instructor_pass_measured_fail} the measurement failed and failed ${a.table.instructor_fail_measured_pass} it passed (McNemar p ${a.mcnemar_p.toFixed(4)}); ${a.unjudged} attempts have no instructor judgement`,
      );
    });
}
