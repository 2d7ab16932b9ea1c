// Shapes of the import service's answers and of the web import API (docs/import-formats.md, "Web API").
// The server builds these objects; the Imports page parses them with the same schemas.
import { z } from "zod";
import { importKinds } from "../domain";
import { delimiterSchema } from "./delimiter";
import { importMappingSchema } from "./mapping";

export const importKindSchema = z.enum(importKinds);

/** One reason a row was refused. row 1 = the first data row after the header; null = the header itself. */
export const rowIssueSchema = z.object({
  row: z.number().int().nullable(),
  column: z.string().nullable(),
  reason: z.string(),
});

export const newCodesSchema = z.object({
  sites: z.array(z.string()),
  instructors: z.array(z.string()),
  manikins: z.array(z.string()),
});

export const importSummarySchema = z.object({
  file: z.string(),
  kind: importKindSchema,
  dryRun: z.boolean(),
  /**
   * imported: written; validated: a dry run that would import; unchanged: every row is already stored as the
   * file has it, so nothing was written and no batch recorded; refused: nothing written (see issues).
   */
  status: z.enum(["imported", "validated", "unchanged", "refused"]),
  batchId: z.number().int().nullable(),
  sha256: z.string().nullable(),
  /** What inserted/updated/unchanged count: file rows, or attempts (compressions files). */
  unit: z.enum(["rows", "attempts"]),
  /** The column separator read off the header line; null when the file held no line at all. */
  delimiter: delimiterSchema.nullable(),
  rowsRead: z.number().int(),
  inserted: z.number().int(),
  updated: z.number().int(),
  unchanged: z.number().int(),
  /** Refused file rows (for compressions: every row of a refused attempt). */
  rejected: z.number().int(),
  attemptsRead: z.number().int().nullable(),
  attemptsRejected: z.number().int().nullable(),
  newCodes: newCodesSchema,
  warnings: z.array(z.string()),
  /** The first 1000 reasons; issuesTotal counts all. */
  issues: z.array(rowIssueSchema),
  issuesTotal: z.number().int(),
  durationMs: z.number(),
});
export type ImportSummary = z.infer<typeof importSummarySchema>;

// ---- web API ----

export const uploadFormSchema = z.object({ kind: importKindSchema });

export const columnMatchSchema = z.object({
  /** Quarterbeat's column. */
  column: z.string(),
  required: z.boolean(),
  description: z.string(),
  /** The file's column it is read from, or null when none matched. */
  source: z.string().nullable(),
});

export const previewSchema = z.object({
  /** The column separator read off the header line; null when the file held no line at all. */
  delimiter: delimiterSchema.nullable(),
  /** The file's header row. */
  header: z.array(z.string()),
  /** The first data rows, as text. */
  rows: z.array(z.array(z.string())),
  /** For each Quarterbeat column, the file column the mapping (or the suggestion) reads. */
  columns: z.array(columnMatchSchema),
  /** File columns nobody reads. */
  extra: z.array(z.string()),
  /** Header problems under this mapping (missing required columns …); empty = ready to validate. */
  problems: z.array(z.object({ column: z.string(), reason: z.string() })),
  suggestedMapping: importMappingSchema,
});
export type Preview = z.infer<typeof previewSchema>;

export const uploadSchema = z.object({
  id: z.string(),
  fileName: z.string(),
  kind: importKindSchema,
  size: z.number().int(),
  uploadedAt: z.string(),
});
export type Upload = z.infer<typeof uploadSchema>;

export const uploadResponseSchema = z.object({ upload: uploadSchema, preview: previewSchema });

/** Body of preview / validate / import requests: a mapping given inline, or a saved preset, or neither. */
export const runRequestSchema = z
  .object({
    mapping: importMappingSchema.optional(),
    presetId: z.number().int().positive().optional(),
    skipInvalid: z.boolean().optional(),
  })
  .strict();
export type RunRequest = z.infer<typeof runRequestSchema>;

export const jobStatuses = ["queued", "running", "done", "failed", "interrupted"] as const;
export type JobStatus = (typeof jobStatuses)[number];
/** A job with one of these statuses will not change again. */
export const finishedJobStatuses: readonly JobStatus[] = ["done", "failed", "interrupted"];

/** Why an upload's file was removed: the server restarted, or it was kept as long as uploads are. */
export const uploadEndReasons = ["restarted", "expired"] as const;
export type UploadEndReason = (typeof uploadEndReasons)[number];

export const jobSchema = z.object({
  id: z.string(),
  uploadId: z.string(),
  mode: z.enum(["validate", "import"]),
  /** interrupted: the server stopped while the job waited or ran; nothing was written (error says so). */
  status: z.enum(jobStatuses),
  progress: z.object({
    bytesRead: z.number().int(),
    totalBytes: z.number().int().nullable(),
    rows: z.number().int(),
  }),
  summary: importSummarySchema.nullable(),
  /** Set when status is failed: what went wrong (not a row problem; those are in summary.issues). */
  error: z.string().nullable(),
  /** Where to download every refused row as CSV, once the job is done and something was refused. */
  rejectedCsvUrl: z.string().nullable(),
  createdAt: z.string(),
});
export type ImportJob = z.infer<typeof jobSchema>;
export const jobResponseSchema = z.object({ job: jobSchema });

export const batchSchema = z.object({
  id: z.number().int(),
  kind: importKindSchema,
  fileName: z.string(),
  sha256: z.string(),
  source: z.enum(["cli", "web", "seed"]),
  status: z.enum(["applied", "undone"]),
  userId: z.number().int().nullable(),
  userEmail: z.string().nullable(),
  rowsRead: z.number().int(),
  inserted: z.number().int(),
  updated: z.number().int(),
  unchanged: z.number().int(),
  rejected: z.number().int(),
  newCodes: newCodesSchema.nullable(),
  warnings: z.array(z.string()).nullable(),
  createdAt: z.string(),
  undoneAt: z.string().nullable(),
});
export type ImportBatch = z.infer<typeof batchSchema>;
export const batchListResponseSchema = z.object({ batches: z.array(batchSchema), total: z.number().int() });
export const batchListQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).default(0),
  kind: importKindSchema.optional(),
});

export const rejectedRowSchema = z.object({
  rowNumber: z.number().int().nullable(),
  column: z.string().nullable(),
  reason: z.string(),
  raw: z.record(z.string(), z.string()).nullable(),
});
export const batchDetailResponseSchema = z.object({
  batch: batchSchema,
  rejectedRows: z.array(rejectedRowSchema),
  rejectedTotal: z.number().int(),
});

export const undoResultSchema = z.object({
  batch: batchSchema,
  deleted: z.number().int(),
  restored: z.number().int(),
});

export const presetSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  kind: importKindSchema,
  mapping: importMappingSchema,
  createdBy: z.number().int().nullable(),
  createdAt: z.string(),
});
export type ImportPreset = z.infer<typeof presetSchema>;
export const newPresetSchema = z.object({
  name: z.string().trim().min(1, "Name the preset").max(80, "Use at most 80 characters"),
  kind: importKindSchema,
  mapping: importMappingSchema,
});
export const presetListQuerySchema = z.object({ kind: importKindSchema.optional() });
export const presetListResponseSchema = z.object({ presets: z.array(presetSchema) });
export const presetResponseSchema = z.object({ preset: presetSchema });

export const formatsResponseSchema = z.object({
  formats: z.record(
    importKindSchema,
    z.array(z.object({ name: z.string(), required: z.boolean(), description: z.string(), unit: z.enum(["depth", "time", "share"]).nullable() })),
  ),
});
