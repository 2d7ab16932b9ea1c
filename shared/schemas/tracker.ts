// The coordinator's quarter tracker (GET /api/tracker): for one quarter, each instructor with what has arrived.
import { z } from "zod";
import { quarterParamSchema } from "../filters";

export const trackerQuerySchema = z.object({ quarter: quarterParamSchema.optional() });

const count = z.number().int().min(0);

export const trackerRowSchema = z.object({
  instructorId: z.number(),
  code: z.string(),
  name: z.string(),
  siteCode: z.string().nullable(),
  active: z.boolean(),
  /** Classes of the quarter in the class logs. */
  classes: count,
  /** Attempts of the quarter measured for this instructor's classes. */
  attempts: count,
  /** When a class log holding one of this instructor's classes (of any quarter) was last imported; null if never. */
  lastImportAt: z.string().nullable(),
  /** Refused rows kept with applied batches that name this instructor or one of their classes. */
  rejectedRows: count,
});
export type TrackerRow = z.infer<typeof trackerRowSchema>;

export const trackerAnswerSchema = z.object({
  quarter: z.string(),
  instructors: z.array(trackerRowSchema),
  /** Refused rows that name no instructor or class Quarterbeat knows (e.g. files with renamed columns). */
  unassignedRejectedRows: count,
});
export type TrackerAnswer = z.infer<typeof trackerAnswerSchema>;
