// Answer of GET /api/equipment: the manikin fleet, consumables per 100 learners and what needs attention.
import { z } from "zod";
import { equipmentEventTypes } from "../domain";
import { patientTypes } from "../scoring/policy";
import { periodSchema } from "./insight";

const count = z.number().int().min(0);
const siteRef = z.object({ id: z.number(), code: z.string() });

export const fleetRowSchema = z.object({
  id: z.number(),
  assetId: z.string(),
  patientType: z.enum(patientTypes).nullable(),
  site: siteRef.nullable(),
  inServiceSince: z.string().nullable(),
  retiredOn: z.string().nullable(),
  /**
   * Attempts and compressions on this manikin per quarter of the trend window, oldest first; both null when
   * the quarter's use holds too few attempts or instructors other than the viewer to be shown to them.
   */
  usage: z.array(z.object({ quarter: z.string(), attempts: count.nullable(), compressions: count.nullable() })),
  /** Compressions recorded since the last service (since it came into use when never serviced). */
  compressionsSinceService: count,
  lastServiceDate: z.string().nullable(),
  openFaults: count,
});

const consumable = z.object({
  fromClassLogs: count,
  fromEvents: count,
  /** The class logs' count, the figure every page and the report use; fromEvents is shown beside it, not added. */
  total: count,
  /** total × 100 / learners; null without learners. */
  per100Learners: z.number().nullable(),
});

export const consumablesRowSchema = z.object({
  site: siteRef,
  quarter: z.string(),
  learners: count,
  lungs: consumable,
  mouthpieces: consumable,
  batteries: consumable,
});

export const attentionKinds = ["service_by_compressions", "service_by_days", "open_fault", "mouthpiece_cleaning"] as const;

export const attentionItemSchema = z.object({
  kind: z.enum(attentionKinds),
  site: siteRef.nullable(),
  manikin: z.object({ id: z.number(), assetId: z.string() }).nullable(),
  classId: z.string().nullable(),
  /** Plain-language reason, naming the figure and the threshold. */
  reason: z.string(),
});

export const thresholdSchema = z.object({
  value: z.number(),
  /** True while the network keeps the project default (policy, not a guideline). */
  projectDefault: z.boolean(),
  defaultValue: z.number(),
});

export const equipmentAnswerSchema = z.object({
  period: periodSchema,
  asOf: z.string(),
  thresholds: z.object({
    serviceEveryCompressions: thresholdSchema,
    serviceEveryDays: thresholdSchema,
    minMouthpieceCleansPerLearner: thresholdSchema,
    note: z.string(),
  }),
  fleet: z.array(fleetRowSchema),
  consumables: z.array(consumablesRowSchema),
  attention: z.array(attentionItemSchema),
});
export type EquipmentAnswer = z.infer<typeof equipmentAnswerSchema>;

export const driftFlags = ["check", "ok", "too few classes"] as const;
export type DriftFlag = (typeof driftFlags)[number];

/** Answer of GET /api/equipment/drift: each manikin's depth readings against its peers in the same classes. */
export const manikinDriftSchema = z.object({
  manikin: z.string(),
  site: z.string().nullable(),
  profile: z.enum(patientTypes),
  /** Paired classes (k). */
  classes: count,
  /** Mean of the paired differences (mm) with its standard error and 95 % interval. */
  offset_mm: z.number().nullable(),
  se_mm: z.number().nullable(),
  ci95: z.tuple([z.number(), z.number()]).nullable(),
  flag: z.enum(driftFlags),
  flagged_in_round: z.number().int().min(1).nullable(),
  /** The paired differences, oldest class first; the class id only for those who see every site's classes. */
  differences: z.array(z.object({ classId: z.string().nullable(), date: z.string(), difference_mm: z.number(), attempts: count, peer_attempts: count })),
});
export type ManikinDriftRow = z.infer<typeof manikinDriftSchema>;

export const driftAnswerSchema = z.object({
  period: periodSchema,
  rule: z.object({ minClasses: count, minOffsetMm: z.number() }),
  manikins: z.array(manikinDriftSchema),
});
export type DriftAnswer = z.infer<typeof driftAnswerSchema>;

/** One line of a manikin's equipment log. */
export const equipmentLogEntrySchema = z.object({
  date: z.string(),
  event: z.enum(equipmentEventTypes),
  quantity: count,
  note: z.string(),
  /** Faults only: whether it was marked resolved. */
  resolved: z.boolean(),
});

/** Answer of GET /api/equipment/manikins/:assetId: one manikin's record, its service state, use and depth readings. */
export const manikinRecordSchema = z.object({
  period: periodSchema,
  asOf: z.string(),
  thresholds: equipmentAnswerSchema.shape.thresholds,
  manikin: fleetRowSchema,
  attention: z.array(attentionItemSchema),
  /** The most recent log lines, newest first; `logTotal` counts them all. */
  log: z.array(equipmentLogEntrySchema),
  logTotal: count,
  rule: driftAnswerSchema.shape.rule,
  /** The manikin against its peers in the period; null when it shared no class with a peer of its patient type. */
  drift: manikinDriftSchema.nullable(),
});
export type ManikinRecord = z.infer<typeof manikinRecordSchema>;
