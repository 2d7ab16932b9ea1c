// The per-field problems of a refused request. The server answers 409 and 422 with
// details [{ path: "field" or "field.part", message }] (server/errors.ts); any other details name no field.
import { z } from "zod";

const fieldProblemListSchema = z.array(z.object({ path: z.string(), message: z.string() }));

/** First message per top-level field; a problem without a field goes under "form". */
export function fieldProblems(details: unknown): Partial<Record<string, string>> {
  const parsed = fieldProblemListSchema.safeParse(details);
  const problems: Partial<Record<string, string>> = {};
  if (!parsed.success) return problems;
  for (const { path, message } of parsed.data) {
    const field = path.split(".")[0] || "form";
    problems[field] ??= message;
  }
  return problems;
}
