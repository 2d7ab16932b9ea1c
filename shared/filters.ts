// The filters every insight page carries in its URL's query string, validated the same way on both sides.
// A period is one quarter or a from/to range of quarters; the other filters narrow the attempts counted.
// Sites, instructors and manikins are named by their code (asset id for manikins) or by their numeric id.
import { z } from "zod";
import { feedbackModes } from "./domain";
import { isQuarter } from "./period";
import { patientTypes } from "./scoring/policy";
import { attemptErrorNames } from "./scoring/scoreAttempt";

export const quarterParamSchema = z.string({ error: "Use a quarter such as 2026-Q3" }).trim().refine(isQuarter, "Use a quarter such as 2026-Q3");

/** A code as written in the import files, or a numeric id; anything else (quotes, spaces, SQL) is refused. */
export const refParamSchema = z
  .string({ error: "Use a code of letters, digits, '.', '_' or '-', or a numeric id" })
  .trim()
  .regex(/^[A-Za-z0-9._-]{1,32}$/, "Use a code of letters, digits, '.', '_' or '-', or a numeric id");

export const insightFilterShape = {
  quarter: quarterParamSchema.optional(),
  from: quarterParamSchema.optional(),
  to: quarterParamSchema.optional(),
  site: refParamSchema.optional(),
  profile: z.enum(patientTypes, { error: `Use one of ${patientTypes.join(", ")}` }).optional(),
  feedback: z.enum(feedbackModes, { error: `Use one of ${feedbackModes.join(", ")}` }).optional(),
  instructor: refParamSchema.optional(),
  manikin: refParamSchema.optional(),
};

type FilterFields = { quarter?: string; from?: string; to?: string };

/** The period rules shared by every route's query schema. */
function checkPeriod(value: FilterFields, ctx: z.RefinementCtx) {
  if (value.quarter && (value.from || value.to)) {
    ctx.addIssue({ code: "custom", path: ["quarter"], message: "Give either one quarter or a from/to range, not both" });
  }
  if (value.from && value.to && value.from > value.to) {
    ctx.addIssue({ code: "custom", path: ["to"], message: "The end of the range must not come before its start" });
  }
}

export const insightFiltersSchema = z.object(insightFilterShape).superRefine(checkPeriod);

/**
 * How instructors are compared: `none` against the network rate as it is (crude), `case-mix` against the
 * rate expected from their own mix of patient types and feedback displays (indirect standardisation).
 * Comparisons between instructors default to `case-mix`.
 */
export const adjustModes = ["case-mix", "none"] as const;
export type AdjustMode = (typeof adjustModes)[number];
export const adjustParamSchema = z.enum(adjustModes, { error: `Use one of ${adjustModes.join(", ")}` });
export const adjustQuerySchema = z.object({ adjust: adjustParamSchema.default("case-mix") });
export type InsightFilters = z.infer<typeof insightFiltersSchema>;

/** Filters plus extra query fields of one route, with the same period rules. */
export function filtersWith<T extends z.ZodRawShape>(extra: T) {
  return z.object({ ...insightFilterShape, ...extra }).superRefine((value, ctx) => checkPeriod(value as FilterFields, ctx));
}

const pageNumber = (what: string, max: number, fallback: number) =>
  z.coerce
    .number({ error: `${what} must be a whole number` })
    .int(`${what} must be a whole number`)
    .min(1, `${what} must be at least 1`)
    .max(max, `${what} must be at most ${max}`)
    .default(fallback);

export const errorParamSchema = z.enum(attemptErrorNames, { error: `Use one of ${attemptErrorNames.join(", ")}` });

/** Columns the attempt list may be sorted by, in the order the list shows them; each is also a column's key. */
export const attemptSortKeys = [
  "id",
  "startedAt",
  "learner",
  "class",
  "site",
  "instructor",
  "manikin",
  "profile",
  "feedback",
  "passed",
  "instructorResult",
  "errors",
  "score",
  "stream",
  "depth",
  "depthOk",
  "rate",
  "rateOk",
  "recoilOk",
  "handsOn",
  "longestPause",
] as const;
export type AttemptSortKey = (typeof attemptSortKeys)[number];

export const sortDirections = ["asc", "desc"] as const;
export type SortDirection = (typeof sortDirections)[number];

/** A pseudonymous learner code as the import accepts it, or the start of one. */
export const learnerParamSchema = z
  .string({ error: "Use a learner code of letters, digits, '.', '_' or '-'" })
  .trim()
  .regex(/^[A-Za-z0-9._-]{1,64}$/, "Use a learner code of letters, digits, '.', '_' or '-' (at most 64)");

/** The search over attempts shared by the list and its CSV: filters, sort; the list adds paging. */
const attemptSearchShape = {
  error: errorParamSchema.optional(),
  class: refParamSchema.optional(),
  /** Whether a compression stream is stored for the attempt. */
  stream: z.enum(["yes", "no"], { error: "Use yes or no" }).optional(),
  learner: learnerParamSchema.optional(),
  /** `exact` (default) matches the whole code, `prefix` codes that start with it; both ignore case. */
  learnerMatch: z.enum(["exact", "prefix"], { error: "Use exact or prefix" }).default("exact"),
  sort: z.enum(attemptSortKeys, { error: `Use one of ${attemptSortKeys.join(", ")}` }).optional(),
  dir: z.enum(sortDirections, { error: "Use asc or desc" }).optional(),
};

export const attemptExportQuerySchema = filtersWith(attemptSearchShape);
export type AttemptExportQuery = z.infer<typeof attemptExportQuerySchema>;

export const attemptListQuerySchema = filtersWith({
  ...attemptSearchShape,
  page: pageNumber("page", 1_000_000, 1),
  pageSize: pageNumber("pageSize", 200, 50),
});
export type AttemptListQuery = z.infer<typeof attemptListQuerySchema>;

export const errorsQuerySchema = filtersWith({ error: errorParamSchema.optional() });
export type ErrorsQuery = z.infer<typeof errorsQuerySchema>;

/** The query string for a set of filters (the client builds links with it; empty values are left out). */
export function filtersToQuery(filters: Partial<Record<string, string | number | undefined>>): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) {
    if (value !== undefined && value !== "") params.set(key, String(value));
  }
  return params.toString();
}
