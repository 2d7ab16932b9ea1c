// Improvement actions: the payloads a quality lead or coordinator sends, and the answers of /api/actions.
// An action aims at one figure (the measured pass rate or one error's share), within a scope (the network, a
// site or an instructor, optionally one patient type), from a start date.
import { z } from "zod";
import { actionStatuses } from "../domain";
import { patientTypes } from "../scoring/policy";
import { attemptErrorNames } from "../scoring/scoreAttempt";
import type { AimFigure } from "../vocabulary";
import { isoDateSchema } from "./isoDate";

export const aimFigures = ["passRate", ...attemptErrorNames] as const satisfies readonly AimFigure[];

const actionFields = z.object({
  title: z.string().trim().min(1, "Say what the action is").max(200, "Use at most 200 characters"),
  aim: z.enum(aimFigures, { message: "Choose the figure the action aims to move" }),
  target: z.number({ message: "Enter the target as a percentage" }).min(0, "Use 0 to 100").max(100, "Use 0 to 100"),
  siteId: z.number().int().positive().nullable(),
  instructorId: z.number().int().positive().nullable(),
  profile: z.enum(patientTypes).nullable(),
  startDate: isoDateSchema,
  owner: z.string().trim().min(1, "Name who owns the action").max(120, "Use at most 120 characters"),
  status: z.enum(actionStatuses),
});

const oneScope = (value: { siteId?: number | null; instructorId?: number | null }) => !(value.siteId != null && value.instructorId != null);
const oneScopeMessage = { message: "Choose a site or an instructor, not both (an instructor's scope already names the site)", path: ["instructorId"] };

export const newActionSchema = actionFields.refine(oneScope, oneScopeMessage);
export type NewAction = z.infer<typeof newActionSchema>;

/** A change to an action; a scope change names both siteId and instructorId so the pair stays consistent. */
export const updateActionSchema = actionFields.partial().refine(oneScope, oneScopeMessage);
export type ActionChanges = z.infer<typeof updateActionSchema>;

export const newActionNoteSchema = z.object({
  date: isoDateSchema,
  text: z.string().trim().min(1, "Write the note").max(2000, "Use at most 2000 characters"),
});
export type NewActionNote = z.infer<typeof newActionNoteSchema>;

export const actionRowSchema = z.object({
  id: z.number(),
  title: z.string(),
  aim: z.enum(aimFigures),
  target: z.number(),
  siteId: z.number().nullable(),
  siteCode: z.string().nullable(),
  instructorId: z.number().nullable(),
  instructorCode: z.string().nullable(),
  profile: z.enum(patientTypes).nullable(),
  startDate: z.string(),
  owner: z.string(),
  status: z.enum(actionStatuses),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type ActionRow = z.infer<typeof actionRowSchema>;

export const actionNoteSchema = z.object({ id: z.number(), date: z.string(), text: z.string(), createdAt: z.string() });
export type ActionNote = z.infer<typeof actionNoteSchema>;

const count = z.number().int().min(0);

/** The aim figure over some quarters: x attempts counted (passed, or failing on the error) of n measured. */
export const aimTallySchema = z.object({ from: z.string(), to: z.string(), x: count, n: count, rate: z.number().nullable() });
export type AimTally = z.infer<typeof aimTallySchema>;

export const evaluationPhases = ["before", "transition", "after"] as const;

export const evaluationPointSchema = z.object({
  period: z.string(),
  phase: z.enum(evaluationPhases),
  x: count,
  n: count,
  rate: z.number().nullable(),
});
export type EvaluationPoint = z.infer<typeof evaluationPointSchema>;

/** Anhøj run-chart rules applied to the points from the start on, around the median of the baseline points. */
export const runChartAnswerSchema = z.object({
  baselineMedian: z.number(),
  useful: count,
  longestRun: count,
  longestRunLimit: count,
  crossings: count,
  crossingsLimit: count,
  signal: z.boolean(),
});

export const actionEvaluationSchema = z.object({
  /** The points are quarters: attempt figures are summarised per quarter. */
  resolution: z.literal("quarter"),
  /** The quarter holding the start date; it counts as "after" only when the action starts on its first day. */
  startQuarter: z.string(),
  before: aimTallySchema.nullable(),
  after: aimTallySchema.nullable(),
  /** after − before, with Newcombe's 95 % interval; null until both sides have attempts. */
  difference: z.object({ difference: z.number(), low: z.number(), high: z.number() }).nullable(),
  verdict: z.enum(["up", "down", "no clear change"]).nullable(),
  /** Whether the after rate is on the target's side (at or above it for the pass rate, at or below for an error). */
  targetMet: z.boolean().nullable(),
  points: z.array(evaluationPointSchema),
  runChart: runChartAnswerSchema.nullable(),
});
export type ActionEvaluation = z.infer<typeof actionEvaluationSchema>;

/** An action in the list, with the verdict of its evaluation (null until both sides have attempts, or when the viewer may not see the scope's figures). */
export const actionListRowSchema = actionRowSchema.extend({ verdict: actionEvaluationSchema.shape.verdict });
export type ActionListRow = z.infer<typeof actionListRowSchema>;

/** GET /api/actions. */
export const actionListAnswerSchema = z.object({ actions: z.array(actionListRowSchema), mayManage: z.boolean() });
/** GET /api/actions/:id: the action, its notes and its evaluation (null when the viewer may not see the scope's figures). */
export const actionDetailAnswerSchema = z.object({
  action: actionRowSchema,
  notes: z.array(actionNoteSchema),
  evaluation: actionEvaluationSchema.nullable(),
  mayManage: z.boolean(),
});
export type ActionDetailAnswer = z.infer<typeof actionDetailAnswerSchema>;

/** A dated mark for trend charts: an action whose scope the chart's filters touch. */
export const actionMarkSchema = z.object({ id: z.number(), title: z.string(), startDate: z.string(), quarter: z.string() });
export type ActionMark = z.infer<typeof actionMarkSchema>;
export const actionMarksAnswerSchema = z.object({ marks: z.array(actionMarkSchema) });
