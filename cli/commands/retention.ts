// `quarterbeat retention --from 2025-Q1 --to 2026-Q4`: first-attempt pass rates of returning learners by
// months since their previous class, beside first-timers (the service a retention page will use).
import type { Command } from "commander";
import { z } from "zod";
import { retention } from "../../server/metrics/retention";
import { context } from "../context";
import { checkQuarterRange } from "../quarterRange";

const optionsSchema = z.object({ from: z.string(), to: z.string(), json: z.boolean().optional() });

export function registerRetention(program: Command) {
  program
    .command("retention")
    .description("Whether returning learners pass their first attempt, by months since their previous class")
    .requiredOption("--from <quarter>", "first quarter of returning (or first) classes, e.g. 2025-Q1")
    .requiredOption("--to <quarter>", "last quarter, e.g. 2026-Q4")
    .option("--json", "print JSON")
    .action((raw: unknown, command: Command) => {
      const options = optionsSchema.parse(raw);
      checkQuarterRange(options.from, options.to);
      const answer = retention(context(command).db, options.from, options.to);
      if (options.json) return console.log(JSON.stringify(answer, null, 2));
      const pct = (x: number | null) => (x === null ? "–" : `${(x * 100).toFixed(1)} %`);
      const line = (label: string, g: { learners: number; passed: number; rate: number | null; ci95: [number, number] | null }, noun: string) =>
        console.log(
          `  ${label.padEnd(24)} ${String(g.learners).padStart(6)} ${noun} · first attempt passed ${pct(g.rate)}${g.ci95 ? ` (95 % interval ${pct(g.ci95[0])} – ${pct(g.ci95[1])})` : ""}`,
        );
      console.log(`Classes from ${options.from} to ${options.to}`);
      line("first time", answer.first_time, "learners");
      for (const bin of answer.returning) line(`back after ${bin.months} months`, bin, "returns ");
    });
}
