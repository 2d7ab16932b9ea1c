// The funder report as the API answers it: the period it covers, every figure with its display text already
// made (so the web page and the PDF say exactly the same thing), and the request bodies of the report routes.
import { z } from "zod";
import { REPORT_PERIOD_RE } from "../period";
import { emailSchema } from "./auth";
import type { ChangeVerdict } from "../stats/difference";

/** A quarter such as 2026-Q3, or a whole year such as 2026. */
export const periodSchema = z.string().trim().toUpperCase().regex(REPORT_PERIOD_RE, "Use a quarter such as 2026-Q3 or a year such as 2026");
export type Period = z.infer<typeof periodSchema>;

export const quarterNotesSchema = z.object({
  actions: z.string().max(4000, "Use at most 4000 characters"),
});
export type QuarterNotes = z.infer<typeof quarterNotesSchema>;

/** The coordinator's own words above the report in every message: why it is sent and what is new. */
export const coverNoteSchema = z
  .string({ error: "Write a cover note for the funders" })
  .trim()
  .min(1, "Write a cover note for the funders")
  .max(2000, "Use at most 2000 characters");

/** POST /api/reports/:period: whether the new version lists the network's improvement actions. */
export const generateReportSchema = z.object({ includeActions: z.boolean({ message: "Say yes or no" }).default(false) });
export type GenerateReportRequest = z.infer<typeof generateReportSchema>;

export const sendReportSchema = z.object({
  coverNote: coverNoteSchema,
  extraRecipients: z.array(emailSchema).max(20, "Send to at most 20 extra addresses at once").default([]),
});
export type SendReportRequest = z.infer<typeof sendReportSchema>;

/**
 * Why a figure is not shown: "small" = it comes from fewer people or events than the network's smallest
 * group shown; "protects-other" = it is hidden so that a shown total cannot give away a small one.
 */
export type HiddenReason = "small" | "protects-other";

/** A count as shown in the report. `value` is null whenever the count is hidden. */
export interface CountFigure {
  value: number | null;
  hidden: HiddenReason | null;
  text: string;
}

/** A proportion (0–1) with its Wilson 95 % interval, hidden together when its group is too small. */
export interface RateFigure {
  value: number | null;
  low: number | null;
  high: number | null;
  /** How many attempts, learners, … the rate is made of. */
  n: CountFigure;
  hidden: HiddenReason | null;
  /** "68.2 %" or "fewer than 5" */
  text: string;
  /** "61.0–74.6 %" or "" */
  intervalText: string;
}

/** A number per 100 learners (consumables), hidden when the learners or the events are too few. */
export interface PerHundredFigure {
  value: number | null;
  hidden: HiddenReason | null;
  text: string;
}

export type { ChangeVerdict };

export interface ReportComparison {
  /** "the previous quarter", "the same quarter last year", "the previous year" */
  label: string;
  period: string;
  passRate: RateFigure;
  /** Percentage points, current minus earlier; null when either rate is hidden or missing. */
  changePoints: number | null;
  /** Relative change (0.1 = +10 %), from the shared changeFrom; null as above. */
  relativeChange: number | null;
  verdict: ChangeVerdict | null;
  text: string;
}

export interface TrendPoint {
  quarter: string;
  passRate: RateFigure;
  /** p-chart limits (3 sigma) for this quarter; null when the quarter is hidden or empty. */
  lcl: number | null;
  ucl: number | null;
  outside: boolean;
}

export interface ErrorRow {
  name: string;
  label: string;
  count: CountFigure;
  /** Share of all errors found; null when hidden. */
  share: number | null;
  cumulativeShare: number | null;
}

export interface GroupResult {
  key: string;
  label: string;
  attempts: CountFigure;
  passRate: RateFigure;
}

/** First-attempt pass rate of one group of learners: first-timers, or those back after so many months. */
export interface RetentionGroupResult {
  key: string;
  label: string;
  /** Learner–class pairs: a learner back twice counts twice. */
  learners: CountFigure;
  firstAttemptPassRate: RateFigure;
}

export interface ReportData {
  period: string;
  kind: "quarter" | "year";
  /** "July–September 2026" or "January–December 2026" */
  periodLabel: string;
  quarters: string[];
  networkName: string;
  generatedAt: string;
  policyVersion: number;
  suppressionMinCount: number;
  hasData: boolean;
  reach: {
    classes: CountFigure;
    learners: CountFigure;
    sites: CountFigure;
    instructors: CountFigure;
    attempts: CountFigure;
    byCourse: { key: string; label: string; classes: CountFigure; learners: CountFigure }[];
  };
  passRate: RateFigure;
  comparisons: ReportComparison[];
  /**
   * `centre` from the baseline quarters `baseline` (the overview chart's, cut at the report's last quarter),
   * never from the quarters judged. Versions stored before the baseline was recorded have no `baseline`.
   */
  trend: { points: TrendPoint[]; centre: number | null; baseline?: { from: string; to: string } | null };
  byPatientType: GroupResult[];
  errors: { rows: ErrorRow[]; attemptsWithErrors: CountFigure; actions: string };
  feedback: {
    live: GroupResult;
    hidden: GroupResult;
    /** Live minus hidden pass rate in percentage points; null when either is hidden. */
    differencePoints: number | null;
    verdict: ChangeVerdict | null;
  };
  agreement: {
    /** Attempts where the instructor also recorded pass or fail. */
    pairs: CountFigure;
    kappa: number | null;
    /** Share of those attempts where instructor and measurement agreed. */
    observedAgreement: number | null;
    kappaText: string;
    completionRate: RateFigure;
    /** Learners (by pseudonymous code) who passed at least once: the like-for-like figure beside completionRate. */
    everPassedRate: RateFigure;
    objectivePassRate: RateFigure;
  };
  equipment: {
    manikinsUsed: CountFigure;
    compressions: CountFigure;
    compressionsPerManikin: number | null;
    lungsPer100Learners: PerHundredFigure;
    mouthpiecesPer100Learners: PerHundredFigure;
    batteriesPer100Learners: PerHundredFigure;
    services: CountFigure;
    faults: CountFigure;
  };
  methods: {
    /** Policy versions the period's attempts were scored under (the bands below are the current version's). */
    scoredUnderVersions: number[];
    bands: { key: string; label: string; depth: string; rate: string; recoil: string }[];
    /** The criteria an attempt must all meet, as phrases. */
    passRule: string[];
    passRuleNote: string;
    sources: string[];
    safetyNote: string;
    suppressionNote: string;
  };
  narrative: string[];
  /**
   * Skill retention across recertifications in the period, network-wide, suppressed like every other cell.
   * Absent from reports stored before the figure existed.
   */
  retention?: { firstTime: RetentionGroupResult; returning: RetentionGroupResult[] };
  /**
   * The improvement actions started by the end of the period, when the coordinator chose to include them:
   * what, aimed at which figure, where, from when and how far along — never who owns them, and none aimed at
   * a single instructor. Absent when not chosen.
   */
  improvementActions?: ReportAction[];
}

export interface ReportAction {
  title: string;
  aim: string;
  scope: string;
  startDate: string;
  status: string;
}

/** A stored report version, without its data and PDF bytes. */
export interface ReportVersion {
  id: number;
  period: string;
  version: number;
  createdAt: string;
  createdBy: string | null;
  pdfBytes: number;
  lastSend: { status: "sent" | "failed"; createdAt: string } | null;
  /** When funders could first see this version; null while only the coordinator sees it. */
  releasedAt: string | null;
}

/** The answer to a release: the version, and which funders' notices the mail server took. */
export interface ReleaseOutcome {
  report: ReportVersion;
  /** False when the version was already released: nothing changed and no notice went out again. */
  released: boolean;
  notified: string[];
  failed: { address: string; error: string }[];
}

export interface ReportSendRow {
  id: number;
  reportId: number;
  period: string;
  version: number;
  sentBy: string | null;
  recipients: string[];
  /** The recipients whose message the mail server accepted (each gets a message of their own). */
  delivered: string[];
  coverNote: string;
  status: "sent" | "failed";
  error: string | null;
  messageId: string | null;
  createdAt: string;
}

export interface OutboxMessage {
  id: number;
  receivedAt: string;
  from: string;
  recipients: string[];
  subject: string;
  text: string;
  attachments: { index: number; filename: string; contentType: string; size: number }[];
}
