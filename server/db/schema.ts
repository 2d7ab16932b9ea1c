// The one source of Quarterbeat's table types. Tables and columns are snake_case in SQLite
// (drizzle's `casing: "snake_case"`), camelCase in TypeScript.
//
// Shape decisions (see docs/decisions/001-data-model.md):
// - Attempts carry copies of their class's quarter, site and instructor so that network statistics over a
//   million attempts filter and group on one indexed table without joins.
// - Attempt errors are stored as a bitmask (shared/scoring: bit i = attemptErrorNames[i]).
// - Compression streams are stored compactly as one BLOB per attempt (server/streams/codec.ts).
// - Rows written by an import carry the batch id so that a batch can be undone.
import { sql } from "drizzle-orm";
import { blob, index, integer, primaryKey, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import type { AlertKind } from "../../shared/alertKinds";
import type { AimFigure } from "../../shared/vocabulary";
import { actionStatuses, courseTypes, equipmentEventTypes, feedbackModes, importKinds, lengthUnits, userRoles } from "../../shared/domain";
import { jobStatuses, uploadEndReasons } from "../../shared/import/api";

const patientTypes = ["infant", "child", "adult"] as const;

const createdAt = () =>
  text()
    .notNull()
    .default(sql`(strftime('%Y-%m-%dT%H:%M:%fZ', 'now'))`);

/** Key/value network settings (network name, session secret, current policy version, …). */
export const settings = sqliteTable("settings", {
  key: text().primaryKey(),
  value: text().notNull(),
  updatedAt: createdAt(),
});

/** Every version of the network's scoring policy; scores record the version that produced them. */
export const policyVersions = sqliteTable("policy_versions", {
  version: integer().primaryKey(),
  policy: text({ mode: "json" }).notNull(),
  note: text().notNull().default(""),
  createdBy: integer().references(() => users.id),
  createdAt: createdAt(),
});

export const sites = sqliteTable("sites", {
  id: integer().primaryKey({ autoIncrement: true }),
  code: text().notNull().unique(),
  name: text().notNull(),
  active: integer({ mode: "boolean" }).notNull().default(true),
  createdAt: createdAt(),
});

export const instructors = sqliteTable(
  "instructors",
  {
    id: integer().primaryKey({ autoIncrement: true }),
    code: text().notNull().unique(),
    name: text().notNull(),
    siteId: integer().references(() => sites.id),
    active: integer({ mode: "boolean" }).notNull().default(true),
    createdAt: createdAt(),
  },
  (t) => [index("instructors_site_idx").on(t.siteId)],
);

export const users = sqliteTable("users", {
  id: integer().primaryKey({ autoIncrement: true }),
  email: text().notNull().unique(),
  displayName: text().notNull(),
  passwordHash: text().notNull(),
  role: text({ enum: userRoles }).notNull(),
  instructorId: integer().references(() => instructors.id),
  active: integer({ mode: "boolean" }).notNull().default(true),
  lengthUnit: text({ enum: lengthUnits }).notNull().default("mm"),
  /** The alert kinds chosen on the account page; null until chosen, when the role's defaults apply (shared/alertKinds.ts). */
  alertKinds: text({ mode: "json" }).$type<AlertKind[]>(),
  createdAt: createdAt(),
});

/** express-session rows (server/auth/sessionStore.ts). */
export const sessions = sqliteTable(
  "sessions",
  {
    sid: text().primaryKey(),
    sess: text().notNull(),
    expiresAt: integer().notNull(), // epoch ms
  },
  (t) => [index("sessions_expires_idx").on(t.expiresAt)],
);

export const manikins = sqliteTable(
  "manikins",
  {
    id: integer().primaryKey({ autoIncrement: true }),
    assetId: text().notNull().unique(),
    patientType: text({ enum: patientTypes }),
    siteId: integer().references(() => sites.id),
    inServiceSince: text(), // YYYY-MM-DD
    retiredOn: text(),
    createdAt: createdAt(),
  },
  (t) => [index("manikins_site_idx").on(t.siteId)],
);

export const importBatches = sqliteTable(
  "import_batches",
  {
    id: integer().primaryKey({ autoIncrement: true }),
    kind: text({ enum: importKinds }).notNull(),
    fileName: text().notNull(),
    sha256: text().notNull(),
    userId: integer().references(() => users.id),
    source: text({ enum: ["cli", "web", "seed"] }).notNull(),
    status: text({ enum: ["applied", "undone"] })
      .notNull()
      .default("applied"),
    rowsRead: integer().notNull().default(0),
    inserted: integer().notNull().default(0),
    updated: integer().notNull().default(0),
    unchanged: integer().notNull().default(0),
    rejected: integer().notNull().default(0),
    newCodes: text({ mode: "json" }).$type<Record<string, string[]>>(),
    warnings: text({ mode: "json" }).$type<string[]>(),
    createdAt: createdAt(),
    undoneAt: text(),
    undoneBy: integer().references(() => users.id),
  },
  // an instructor's import history lists their own batches, newest first
  (t) => [index("import_batches_user_idx").on(t.userId, t.id)],
);

/** Rows refused by an import run with --skip-invalid, kept with their batch for correction. */
export const rejectedRows = sqliteTable(
  "rejected_rows",
  {
    id: integer().primaryKey({ autoIncrement: true }),
    batchId: integer()
      .notNull()
      .references(() => importBatches.id, { onDelete: "cascade" }),
    rowNumber: integer().notNull(), // 1 = first data row after the header
    column: text(),
    reason: text().notNull(),
    raw: text({ mode: "json" }).$type<Record<string, string>>(),
  },
  (t) => [index("rejected_rows_batch_idx").on(t.batchId)],
);

/** Previous values of rows an import updated, so an undo can put them back. */
export const batchChanges = sqliteTable(
  "batch_changes",
  {
    id: integer().primaryKey({ autoIncrement: true }),
    batchId: integer()
      .notNull()
      .references(() => importBatches.id, { onDelete: "cascade" }),
    tableName: text().notNull(),
    rowKey: text().notNull(),
    previous: text({ mode: "json" }).notNull(),
  },
  (t) => [index("batch_changes_batch_idx").on(t.batchId)],
);

/**
 * Web uploads and their validation and import jobs, so that their ids still answer after a restart. The files
 * live in the server's upload folder; at start-up the uploads of the stopped server are ended (their files
 * removed) and its unfinished jobs marked interrupted (server/imports/records.ts). Housekeeping: no figure
 * reads these tables.
 */
export const importUploads = sqliteTable("import_uploads", {
  id: text().primaryKey(),
  userId: integer().notNull(),
  kind: text({ enum: importKinds }).notNull(),
  fileName: text().notNull(),
  sizeBytes: integer().notNull(),
  /** The stored file, under a random name in the upload folder. */
  path: text().notNull(),
  uploadedAt: text().notNull(),
  /** When and why the file was removed; null while it can be used. */
  endedAt: text(),
  endReason: text({ enum: uploadEndReasons }),
});

export const importJobs = sqliteTable(
  "import_jobs",
  {
    id: text().primaryKey(),
    uploadId: text().notNull(),
    userId: integer().notNull(),
    mode: text({ enum: ["validate", "import"] }).notNull(),
    status: text({ enum: jobStatuses }).notNull(),
    totalBytes: integer(),
    rowsRead: integer().notNull(),
    summary: text({ mode: "json" }),
    error: text(),
    /** Where the job writes its refused rows, beside the upload (removed with it). */
    rejectedPath: text().notNull(),
    /** The refused rows can still be downloaded. */
    rejectedKept: integer({ mode: "boolean" }).notNull(),
    createdAt: text().notNull(),
    finishedAt: text(),
  },
  (t) => [index("import_jobs_status_idx").on(t.status)],
);

export const importPresets = sqliteTable("import_presets", {
  id: integer().primaryKey({ autoIncrement: true }),
  name: text().notNull().unique(),
  kind: text({ enum: importKinds }).notNull(),
  mapping: text({ mode: "json" }).notNull(),
  createdBy: integer().references(() => users.id),
  createdAt: createdAt(),
});

export const classes = sqliteTable(
  "classes",
  {
    id: text().primaryKey(), // class_id from the class log
    date: text().notNull(), // YYYY-MM-DD
    quarter: text().notNull(), // e.g. 2026-Q3, derived from date
    siteId: integer()
      .notNull()
      .references(() => sites.id),
    instructorId: integer()
      .notNull()
      .references(() => instructors.id),
    course: text({ enum: courseTypes }).notNull(),
    learners: integer().notNull(),
    passed: integer().notNull(),
    manikins: text().notNull().default(""), // asset ids separated by ';' as logged
    lungsReplaced: integer(),
    mouthpiecesCleaned: integer(),
    batteriesReplaced: integer(),
    batchId: integer().references(() => importBatches.id),
  },
  (t) => [
    index("classes_quarter_idx").on(t.quarter),
    index("classes_instructor_idx").on(t.instructorId, t.quarter),
    index("classes_site_idx").on(t.siteId, t.quarter),
    // undo deletes a batch's rows by batch id
    index("classes_batch_idx").on(t.batchId),
  ],
);

export const attempts = sqliteTable(
  "attempts",
  {
    id: text().primaryKey(), // attempt_id
    classId: text()
      .notNull()
      .references(() => classes.id),
    learner: text().notNull(), // pseudonymous code, never a name
    manikinId: integer().references(() => manikins.id),
    profile: text({ enum: patientTypes }).notNull(),
    feedback: text({ enum: feedbackModes }).notNull(),
    startedAt: text().notNull(),
    // copies of the class's values, for joinless statistics
    quarter: text().notNull(),
    siteId: integer().notNull(),
    instructorId: integer().notNull(),
    // summary metrics (device summary or computed from the stream)
    durationS: real().notNull(),
    compressions: integer().notNull(),
    rateCpm: real().notNull(),
    depthMm: real().notNull(),
    depthOkPct: real().notNull(),
    tooShallowPct: real().notNull(),
    tooDeepPct: real().notNull(),
    rateOkPct: real().notNull(),
    tooSlowPct: real().notNull(),
    tooFastPct: real().notNull(),
    recoilOkPct: real().notNull(),
    handsOnPct: real().notNull(),
    longestPauseS: real().notNull(),
    pauses: integer(), // only known for stream-derived attempts
    pausesOver10s: integer(),
    instructorResult: text({ enum: ["pass", "fail"] }),
    source: text({ enum: ["summary", "stream"] }).notNull(),
    // Quarterbeat's own score under a policy version
    score: real().notNull(),
    passed: integer({ mode: "boolean" }).notNull(),
    errorMask: integer().notNull(),
    policyVersion: integer()
      .notNull()
      .references(() => policyVersions.version),
    batchId: integer().references(() => importBatches.id),
  },
  (t) => [
    index("attempts_quarter_idx").on(t.quarter, t.profile, t.feedback),
    index("attempts_instructor_idx").on(t.instructorId, t.quarter),
    index("attempts_site_idx").on(t.siteId, t.quarter),
    index("attempts_class_idx").on(t.classId),
    index("attempts_manikin_idx").on(t.manikinId, t.quarter),
    index("attempts_batch_idx").on(t.batchId),
    // a learner's attempts: learner outcomes and returning learners are kept and read through it
    index("attempts_learner_idx").on(t.learner, t.quarter),
  ],
);

/** Raw compressions of an attempt, packed (server/streams/codec.ts). */
/**
 * Attempt tallies by every dimension a figure can be filtered or grouped on (quarter, site, instructor,
 * manikin — 0 for none —, patient type, feedback display) and the policy version that scored them: counts,
 * passes, the instructor-against-measurement cells and each error's count. Kept by triggers on `attempts`
 * (drizzle/0005_attempt_summary_triggers.sql) in the transaction that writes the attempts, so every figure is
 * a sum over a few of these rows instead of a scan of attempts. See docs/decisions/004-metric-summaries.md.
 */
export const attemptTallies = sqliteTable(
  "attempt_tallies",
  {
    quarter: text().notNull(),
    siteId: integer().notNull(),
    instructorId: integer().notNull(),
    manikinId: integer().notNull(), // 0 when the attempt names no manikin
    profile: text({ enum: patientTypes }).notNull(),
    feedback: text({ enum: feedbackModes }).notNull(),
    policyVersion: integer().notNull(),
    n: integer().notNull(),
    passed: integer().notNull(),
    /** instructor's result × measured result: pass/pass, pass/fail, fail/pass, fail/fail */
    judgedPp: integer().notNull(),
    judgedPf: integer().notNull(),
    judgedFp: integer().notNull(),
    judgedFf: integer().notNull(),
    withErrors: integer().notNull(),
    compressions: integer().notNull(),
    // one column per attempt error, in attemptErrorNames order (bit i of the error mask)
    errTooShallow: integer().notNull(),
    errTooDeep: integer().notNull(),
    errTooSlow: integer().notNull(),
    errTooFast: integer().notNull(),
    errIncompleteRecoil: integer().notNull(),
    errLowHandsOn: integer().notNull(),
    errLongPause: integer().notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.quarter, t.profile, t.feedback, t.siteId, t.instructorId, t.manikinId, t.policyVersion] }),
    index("attempt_tallies_instructor_idx").on(t.instructorId, t.quarter),
  ],
);

/** attempt_tallies summed over sites, instructors and manikins: network figures read a few rows per quarter. */
export const networkTallies = sqliteTable(
  "network_tallies",
  {
    quarter: text().notNull(),
    profile: text({ enum: patientTypes }).notNull(),
    feedback: text({ enum: feedbackModes }).notNull(),
    policyVersion: integer().notNull(),
    n: integer().notNull(),
    passed: integer().notNull(),
    judgedPp: integer().notNull(),
    judgedPf: integer().notNull(),
    judgedFp: integer().notNull(),
    judgedFf: integer().notNull(),
    withErrors: integer().notNull(),
    compressions: integer().notNull(),
    errTooShallow: integer().notNull(),
    errTooDeep: integer().notNull(),
    errTooSlow: integer().notNull(),
    errTooFast: integer().notNull(),
    errIncompleteRecoil: integer().notNull(),
    errLowHandsOn: integer().notNull(),
    errLongPause: integer().notNull(),
  },
  (t) => [primaryKey({ columns: [t.quarter, t.profile, t.feedback, t.policyVersion] })],
);

export const summaryMetrics = ["score", "depth_ok_pct", "rate_ok_pct", "recoil_ok_pct", "hands_on_pct"] as const;

/** One packed-pairs column per metric of summaryMetrics (server/metrics/packedValues.ts), fresh for each table. */
function packedMetricColumns() {
  return {
    packedScore: blob({ mode: "buffer" }).notNull(),
    packedDepthOkPct: blob({ mode: "buffer" }).notNull(),
    packedRateOkPct: blob({ mode: "buffer" }).notNull(),
    packedRecoilOkPct: blob({ mode: "buffer" }).notNull(),
    packedHandsOnPct: blob({ mode: "buffer" }).notNull(),
  };
}

/**
 * Each instructor's tallies and exact distributions of the metrics with medians in one quarter, packed: for every
 * patient type × feedback display they taught, the counts of attempt_tallies and each metric's ascending
 * (value, count) pairs at the values as recorded (server/metrics/packedValues.ts). One row per instructor and quarter, so per-instructor medians and ranks
 * over any range read a few thousand rows instead of one row per attempt and metric. Rebuilt from the
 * attempts of the pairs noted in instructor_values_stale by the transaction that changed them; see
 * docs/decisions/008-packed-instructor-distributions.md.
 */
export const instructorValues = sqliteTable(
  "instructor_values",
  {
    quarter: text().notNull(),
    instructorId: integer().notNull(),
    attempts: integer().notNull(),
    // per stratum, the counts of attempt_tallies; stored before the pairs, so reading it stays near the row's start
    tallies: blob({ mode: "buffer" }).notNull(),
    // attempts and judged attempts per site × stratum × manikin: the instructor's cells of the release grid
    cells: blob({ mode: "buffer" }).notNull(),
    // one column per metric, so an answer about one metric reads a fifth of the pairs
    ...packedMetricColumns(),
  },
  (t) => [
    primaryKey({ columns: [t.quarter, t.instructorId] }),
    // each instructor's attempts per quarter without reading the rows (whole-quarter releases ask for them)
    index("instructor_values_attempts_idx").on(t.quarter, t.instructorId, t.attempts),
  ],
);

/**
 * Running totals of instructor_values' tallies and distributions: for each instructor and each quarter they
 * taught, the packed tallies and pairs (same forms) of all their attempts up to and including that quarter. An
 * instructor's figures over a range of quarters are the running total at its end less the one before its start,
 * so a range reads at most two rows per instructor, however many quarters it spans. Rebuilt from instructor_values
 * whenever an instructor-quarter is (server/metrics/runningValues.ts); readers fall back to instructor_values
 * while an instructor-quarter up to the range's end is still noted as changed.
 */
export const instructorRunningValues = sqliteTable(
  "instructor_running_values",
  {
    instructorId: integer().notNull(),
    quarter: text().notNull(),
    tallies: blob({ mode: "buffer" }).notNull(),
    ...packedMetricColumns(),
  },
  // instructor first: "each instructor's latest total up to a quarter" is one index seek per instructor
  (t) => [primaryKey({ columns: [t.instructorId, t.quarter] })],
);

/**
 * Instructor-quarters whose attempts changed since their instructor_values row was built: noted by triggers on
 * attempts (so no write, not even a hand edit, can leave a distribution behind unnoticed), rebuilt and removed
 * before the writing service commits (refreshInstructorValues). Readers take a noted pair from its attempts.
 */
export const instructorValuesStale = sqliteTable(
  "instructor_values_stale",
  {
    quarter: text().notNull(),
    instructorId: integer().notNull(),
  },
  (t) => [primaryKey({ columns: [t.quarter, t.instructorId] })],
);

/**
 * The same distributions for the whole network by quarter, patient type and feedback display only: a few
 * hundred values per group at the resolution devices record, so a network median reads a few thousand rows.
 */
export const networkValues = sqliteTable(
  "network_values",
  {
    metric: text({ enum: summaryMetrics }).notNull(),
    quarter: text().notNull(),
    profile: text({ enum: patientTypes }).notNull(),
    feedback: text({ enum: feedbackModes }).notNull(),
    value: real().notNull(),
    count: integer().notNull(),
  },
  (t) => [primaryKey({ columns: [t.metric, t.quarter, t.profile, t.feedback, t.value] })],
);

/**
 * Each learner's attempts per group (the dimensions of attempt_tallies): how many, how many passed, and their
 * earliest attempt (by start time, then id) with its result. Learner outcomes — first attempt passed, passed at
 * least once — are read from these rows; kept by the same triggers.
 */
export const learnerTallies = sqliteTable(
  "learner_tallies",
  {
    quarter: text().notNull(),
    learner: text().notNull(),
    profile: text({ enum: patientTypes }).notNull(),
    feedback: text({ enum: feedbackModes }).notNull(),
    siteId: integer().notNull(),
    instructorId: integer().notNull(),
    manikinId: integer().notNull(),
    attempts: integer().notNull(),
    passed: integer().notNull(),
    firstStarted: text().notNull(),
    firstId: text().notNull(),
    firstPassed: integer().notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.quarter, t.learner, t.profile, t.feedback, t.siteId, t.instructorId, t.manikinId] }),
    index("learner_tallies_instructor_idx").on(t.instructorId, t.quarter),
  ],
);

/**
 * The same per learner and quarter over the whole network, with the learner's previous quarters: the learner
 * outcomes of a network quarter or range are a plain sum over these rows. Kept by the same triggers.
 */
export const learnerQuarters = sqliteTable(
  "learner_quarters",
  {
    quarter: text().notNull(),
    learner: text().notNull(),
    attempts: integer().notNull(),
    passed: integer().notNull(),
    firstStarted: text().notNull(),
    firstId: text().notNull(),
    firstPassed: integer().notNull(),
    /** The learner's latest earlier quarter with attempts, and with a pass: a range counts each learner once. */
    prevQuarter: text(),
    prevPassQuarter: text(),
  },
  (t) => [primaryKey({ columns: [t.quarter, t.learner] }), index("learner_quarters_learner_idx").on(t.learner, t.quarter)],
);

/**
 * learner_quarters counted by quarter and the learner's previous quarter (with attempts, with a pass; '' for
 * none): the network's learner outcomes over any range are a sum over a few dozen rows instead of a row per
 * learner and quarter. Kept by triggers on learner_quarters (drizzle/0011_learner_quarter_counts.sql).
 */
export const learnerQuarterCounts = sqliteTable(
  "learner_quarter_counts",
  {
    quarter: text().notNull(),
    prevQuarter: text().notNull(),
    prevPassQuarter: text().notNull(),
    learners: integer().notNull(),
    /** Learners whose first attempt of the quarter passed. */
    firstPassed: integer().notNull(),
    /** Learners with a pass in the quarter. */
    withPass: integer().notNull(),
  },
  (t) => [primaryKey({ columns: [t.quarter, t.prevQuarter, t.prevPassQuarter] })],
);

/**
 * Bulk imports switch the per-row summary triggers off inside their own transaction (a row here), note the
 * attempts they insert in summary_pending, and add them to the summaries set-wise before they commit
 * (server/metrics/deferredSummaries.ts). Both tables are empty outside an import's transaction.
 */
export const summaryDeferral = sqliteTable("summary_deferral", {
  id: integer().primaryKey(),
});

export const summaryPending = sqliteTable("summary_pending", {
  id: text().primaryKey(),
});

export const compressionStreams = sqliteTable(
  "compression_streams",
  {
    attemptId: text()
      .primaryKey()
      .references(() => attempts.id, { onDelete: "cascade" }),
    compressions: integer().notNull(),
    data: blob({ mode: "buffer" }).notNull(),
    batchId: integer().references(() => importBatches.id),
  },
  (t) => [index("compression_streams_batch_idx").on(t.batchId)],
);

/** Earlier scores of an attempt, kept when the network rescores under a new policy version. */
export const scoreHistory = sqliteTable(
  "score_history",
  {
    attemptId: text()
      .notNull()
      .references(() => attempts.id, { onDelete: "cascade" }),
    policyVersion: integer().notNull(),
    score: real().notNull(),
    passed: integer({ mode: "boolean" }).notNull(),
    errorMask: integer().notNull(),
    replacedAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.attemptId, t.policyVersion] })],
);

export const equipmentEvents = sqliteTable(
  "equipment_events",
  {
    id: integer().primaryKey({ autoIncrement: true }),
    // natural key of an imported event, so a re-import of the same file is recognised as unchanged
    eventKey: text().notNull(),
    date: text().notNull(),
    manikinId: integer()
      .notNull()
      .references(() => manikins.id),
    siteId: integer().references(() => sites.id),
    event: text({ enum: equipmentEventTypes }).notNull(),
    quantity: integer().notNull().default(1),
    note: text().notNull().default(""),
    resolved: integer({ mode: "boolean" }).notNull().default(false), // faults only
    batchId: integer().references(() => importBatches.id),
  },
  (t) => [
    uniqueIndex("equipment_events_key_idx").on(t.eventKey),
    index("equipment_manikin_idx").on(t.manikinId, t.date),
    index("equipment_batch_idx").on(t.batchId),
  ],
);

/** The coordinator's text for a quarter's report: what the network is doing about the errors found. */
export const quarterNotes = sqliteTable("quarter_notes", {
  quarter: text().primaryKey(),
  actions: text().notNull(),
  updatedBy: integer().references(() => users.id),
  updatedAt: createdAt(),
});

/** Generated funder reports; a sent report can be downloaded again byte for byte. */
export const reports = sqliteTable(
  "reports",
  {
    id: integer().primaryKey({ autoIncrement: true }),
    period: text().notNull(), // 2026-Q3 or 2026
    version: integer().notNull(),
    data: text({ mode: "json" }).notNull(),
    pdf: blob({ mode: "buffer" }).notNull(),
    createdBy: integer().references(() => users.id),
    createdAt: createdAt(),
    // funders see a version only once the coordinator releases it (or sends it to them)
    releasedAt: text(),
    releasedBy: integer().references(() => users.id),
  },
  (t) => [uniqueIndex("reports_period_version_idx").on(t.period, t.version)],
);

export const reportSends = sqliteTable("report_sends", {
  id: integer().primaryKey({ autoIncrement: true }),
  reportId: integer()
    .notNull()
    .references(() => reports.id),
  sentBy: integer().references(() => users.id),
  recipients: text({ mode: "json" }).$type<string[]>().notNull(),
  /** Each recipient gets a message of their own; a retry sends only to those not yet reached. */
  delivered: text({ mode: "json" })
    .$type<string[]>()
    .notNull()
    .default(sql`'[]'`),
  coverNote: text().notNull().default(""),
  status: text({ enum: ["sent", "failed"] }).notNull(),
  error: text(),
  messageId: text(),
  createdAt: createdAt(),
});

/** Messages received by the local mail service that stands in for a hosted SMTP server. */
export const mailbox = sqliteTable("mailbox", {
  id: integer().primaryKey({ autoIncrement: true }),
  receivedAt: createdAt(),
  mailFrom: text().notNull(),
  recipients: text({ mode: "json" }).$type<string[]>().notNull(),
  subject: text().notNull(),
  text: text().notNull(),
  attachments: text({ mode: "json" }).$type<{ filename: string; contentType: string; size: number }[]>().notNull(),
  raw: blob({ mode: "buffer" }).notNull(),
});

/** Every backup taken, scheduled or by `quarterbeat backup`, with the result of its verification. */

export const backupLog = sqliteTable(
  "backup_log",
  {
    id: integer().primaryKey({ autoIncrement: true }),
    takenAt: text().notNull(),
    file: text().notNull(),
    sizeBytes: integer().notNull(),
    source: text({ enum: ["scheduled", "cli"] }).notNull(),
    verified: integer({ mode: "boolean" }).notNull(),
    /** Why verification failed, or what was checked when it passed. */
    message: text().notNull(),
  },
  (t) => [index("backup_log_taken_idx").on(t.takenAt)],
);

/**
 * Improvement actions: what a quality lead or coordinator changed to move one figure, where, and from when.
 * The scope is the network (no site, no instructor), a site or an instructor, optionally one patient type.
 */
export const improvementActions = sqliteTable(
  "improvement_actions",
  {
    id: integer().primaryKey({ autoIncrement: true }),
    title: text().notNull(),
    aim: text().$type<AimFigure>().notNull(),
    /** The aim's target as a percentage (0–100). */
    target: real().notNull(),
    siteId: integer().references(() => sites.id),
    instructorId: integer().references(() => instructors.id),
    profile: text({ enum: patientTypes }),
    startDate: text().notNull(), // YYYY-MM-DD
    owner: text().notNull(),
    status: text({ enum: actionStatuses }).notNull().default("planned"),
    createdBy: integer().references(() => users.id),
    createdAt: createdAt(),
    updatedAt: createdAt(),
  },
  (t) => [index("improvement_actions_start_idx").on(t.startDate)],
);

/** Dated notes on an action's progress. */
export const actionNotes = sqliteTable(
  "action_notes",
  {
    id: integer().primaryKey({ autoIncrement: true }),
    actionId: integer()
      .notNull()
      .references(() => improvementActions.id, { onDelete: "cascade" }),
    date: text().notNull(), // YYYY-MM-DD
    text: text().notNull(),
    createdBy: integer().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index("action_notes_action_idx").on(t.actionId, t.date)],
);

/**
 * Each signal mailed to each user after an import, so a signal reaches a person once, and the alerts history
 * shows what they were told. The summary and link are kept as mailed: the figures behind them move on.
 */
export const alertDeliveries = sqliteTable(
  "alert_deliveries",
  {
    id: integer().primaryKey({ autoIncrement: true }),
    userId: integer()
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    key: text().notNull(),
    kind: text().$type<AlertKind>().notNull(),
    summary: text().notNull(),
    /** The in-app path of the page behind the signal, or null. */
    linkPath: text(),
    linkLabel: text(),
    sentAt: createdAt(),
  },
  (t) => [uniqueIndex("alert_deliveries_user_key_idx").on(t.userId, t.key), index("alert_deliveries_sent_idx").on(t.sentAt)],
);
