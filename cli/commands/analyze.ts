// `quarterbeat analyze <file.csv>`: scores compression streams without the network's database, under the
// project's default policy. JSON numbers are printed at full precision.
import fs from "node:fs";
import type { Command } from "commander";
import { z } from "zod";
import { attemptMetricKeys } from "../../shared/scoring/analyzeStream";
import { patientTypes } from "../../shared/scoring/policy";
import { AppError } from "../../server/errors";
import { analyzeFile } from "../../server/streams/analyzeFile";
import { UsageError } from "../errors";
import { readMappingFile } from "./import";
import { errorLabels } from "../../shared/vocabulary";

const optionsSchema = z.object({
  profile: z.enum(patientTypes).optional(),
  json: z.boolean().optional(),
  map: z.string().optional(),
});

export function registerAnalyze(program: Command) {
  program
    .command("analyze <file>")
    .description("Score the compression streams in a CSV file (nothing is written to the database)")
    .option("--profile <type>", `patient type for every attempt (${patientTypes.join(", ")}); else the file's profile column`)
    .option("--map <file>", "JSON column mapping, as for import")
    .option("--json", "print a JSON array, one object per attempt")
    .action(async (file: string, raw: unknown) => {
      const parsed = optionsSchema.safeParse(raw);
      if (!parsed.success) throw new UsageError(`--profile must be one of ${patientTypes.join(", ")}.`);
      const options = parsed.data;
      if (!fs.existsSync(file) || !fs.statSync(file).isFile()) throw new UsageError(`No file ${file}.`);
      const mapping = options.map ? readMappingFile(options.map) : undefined;
      const result = await analyzeFile({ path: file }, { profile: options.profile, mapping });
      if (result.issuesTotal > 0) {
        const details = result.issues.map((i) => ({
          message: `${file}, ${i.row === null ? "header" : `row ${i.row}`}${i.column ? `, ${i.column}` : ""}: ${i.reason}`,
        }));
        throw new AppError(
          "refused",
          422,
          `${file} cannot be analysed (${result.issuesTotal} problem${result.issuesTotal > 1 ? "s" : ""}; row 1 = first data row after the header):`,
          details,
        );
      }
      if (options.json) {
        const rows = result.attempts.map((a) => {
          const out: Record<string, unknown> = { attempt_id: a.attempt_id };
          for (const key of attemptMetricKeys) out[key] = a.metrics[key];
          out.score = a.score;
          out.passed = a.passed;
          out.errors = a.errors;
          return out;
        });
        console.log(JSON.stringify(rows, null, 2));
        return;
      }
      const fmt = (n: number, digits = 1) => (Number.isInteger(n) ? String(n) : n.toFixed(digits));
      console.table(
        result.attempts.map((a) => ({
          attempt: a.attempt_id,
          profile: a.profile,
          compressions: a.metrics.compressions,
          "rate /min": fmt(a.metrics.rate_cpm),
          "depth mm": fmt(a.metrics.depth_mm),
          "depth ok %": fmt(a.metrics.depth_ok_pct),
          "rate ok %": fmt(a.metrics.rate_ok_pct),
          "recoil ok %": fmt(a.metrics.recoil_ok_pct),
          "hands-on %": fmt(a.metrics.hands_on_pct),
          "longest pause s": fmt(a.metrics.longest_pause_s),
          score: fmt(a.score),
          result: a.passed ? "pass" : "fail",
          why: a.passed ? "" : (a.reason ?? a.errors.map((e) => errorLabels[e]).join("; ")),
        })),
      );
      console.log(`${result.attempts.length} attempts from ${result.rowsRead} rows, scored under the default network policy.`);
    });
}
