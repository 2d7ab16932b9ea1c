// GET /api/system and `quarterbeat system --json`: the state of the installation for coordinators.
import { z } from "zod";
import { batchSchema } from "../import/api";

export const backupLogEntrySchema = z.object({
  takenAt: z.string(),
  file: z.string(),
  sizeBytes: z.number().int().nonnegative(),
  source: z.enum(["scheduled", "cli"]),
  verified: z.boolean(),
  message: z.string(),
});
export type BackupLogEntry = z.infer<typeof backupLogEntrySchema>;

export const quarterGrowthSchema = z.object({
  quarter: z.string(),
  classes: z.number().int().nonnegative(),
  attempts: z.number().int().nonnegative(),
  compressionStreams: z.number().int().nonnegative(),
});
export type QuarterGrowth = z.infer<typeof quarterGrowthSchema>;

export const systemReportSchema = z.object({
  version: z.string(),
  migration: z.object({
    applied: z.string().nullable(),
    appliedCount: z.number().int().nonnegative(),
    latest: z.string(),
    current: z.boolean(),
  }),
  database: z.object({
    file: z.string(),
    /** The database file itself; the write-ahead log beside it is counted apart. */
    fileBytes: z.number().int().nonnegative(),
    walBytes: z.number().int().nonnegative(),
    pageSize: z.number().int().positive(),
    pageCount: z.number().int().nonnegative(),
    freePages: z.number().int().nonnegative(),
  }),
  growth: z.array(quarterGrowthSchema),
  backups: z.object({
    /** The scheduled backups' folder; null when BACKUP_DIR=off. */
    dir: z.string().nullable(),
    filesInDir: z.number().int().nonnegative(),
    bytesInDir: z.number().int().nonnegative(),
    lastVerified: backupLogEntrySchema.nullable(),
    recent: z.array(backupLogEntrySchema),
  }),
  /** The newest import batches (the same rows as the Imports page's history). */
  imports: z.array(batchSchema),
  mail: z.object({
    /** "smtp": SMTP_URL names a mail server; "outbox": the local mail service keeps mail in the Outbox. */
    delivery: z.enum(["smtp", "outbox"]),
    /** The mail server without user or password; null for the Outbox. */
    server: z.string().nullable(),
    reportSends: z.object({ sent: z.number().int().nonnegative(), failed: z.number().int().nonnegative() }),
    lastFailure: z.object({ at: z.string(), error: z.string().nullable() }).nullable(),
    outboxMessages: z.number().int().nonnegative(),
  }),
});
export type SystemReport = z.infer<typeof systemReportSchema>;
