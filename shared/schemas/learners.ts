// Answers of GET /api/learners/retention and GET /api/learners/calibration: skill retention across
// recertifications, and each instructor's pass/fail against the measurement.
import { z } from "zod";
import { patientTypes } from "../scoring/policy";
import { periodSchema } from "./insight";

const count = z.number().int().min(0);
const share = z.number().min(0).max(1);
const interval = z.tuple([z.number(), z.number()]).nullable();

export const retentionBins = ["0-6", "6-12", "12-18", "18-24", "24+"] as const;
export type RetentionBin = (typeof retentionBins)[number];

export const retentionGroupSchema = z.object({
  /** Learner–class pairs. */
  learners: count,
  /** Pairs whose first attempt in the class passed. */
  passed: count,
  rate: share.nullable(),
  /** Wilson 95 % interval of the rate. */
  ci95: interval,
});

export const retentionAnswerSchema = z.object({
  period: periodSchema,
  profile: z.enum(patientTypes).nullable(),
  first_time: retentionGroupSchema,
  returning: z.array(retentionGroupSchema.extend({ months: z.enum(retentionBins) })),
});
export type RetentionAnswer = z.infer<typeof retentionAnswerSchema>;

export const calibrationRowSchema = z.object({
  instructor: z.object({ id: z.number(), code: z.string(), name: z.string() }),
  judged: count,
  both_pass: count,
  instructor_pass_measured_fail: count,
  instructor_fail_measured_pass: count,
  both_fail: count,
  /** Measured failures the instructor passed, of those they judged, with its Wilson 95 % interval. */
  lenient_share: share.nullable(),
  lenient_ci95: interval,
  /** Measured passes the instructor failed, of those they judged, with its Wilson 95 % interval. */
  strict_share: share.nullable(),
  strict_ci95: interval,
  kappa: z.number().nullable(),
  kappa_ci95: interval,
  /** Place by lenient share among the instructors who judged any measured failure (1 = passes the most). */
  lenient_rank: z.number().int().min(1).nullable(),
});
export type CalibrationRow = z.infer<typeof calibrationRowSchema>;

export const calibrationAnswerSchema = z.object({
  period: periodSchema,
  /** Instructors ranked by lenient share in the period (the "of" in "3rd of 12"). */
  ranked: count,
  /** The rows this user may see: every instructor's for those who see everyone, otherwise only their own. */
  rows: z.array(calibrationRowSchema),
  /** Everyone else's shares without names, most lenient first; groups below the small-group threshold left out. */
  others: z.array(z.object({ lenient_share: share.nullable(), strict_share: share.nullable(), kappa: z.number().nullable() })),
  /** Other instructors left out of `others` because they judged too few attempts to show. */
  othersHidden: count,
});
export type CalibrationAnswer = z.infer<typeof calibrationAnswerSchema>;
