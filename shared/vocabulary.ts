// The one vocabulary of figures and dimensions: every page, chart, table, CSV export, the PDF report and the
// CLI take their words from here, so the same thing is never called two names. Add a word here, not in a page.
import type { ActionStatus, CourseType, EquipmentEventType, FeedbackMode } from "./domain";
import type { PatientType } from "./scoring/policy";
import type { AttemptError } from "./scoring/scoreAttempt";
import type { DriftFlag } from "./schemas/equipment";
import type { RetentionBin } from "./schemas/learners";

/** The ways figures can be narrowed or grouped. */
export const dimensionNames = {
  period: "Period",
  site: "Site",
  instructor: "Instructor",
  patientType: "Patient type",
  feedback: "Feedback display",
  manikin: "Manikin",
} as const;
export type Dimension = keyof typeof dimensionNames;

export const patientTypeNames: Record<PatientType, string> = { infant: "Infant", child: "Child", adult: "Adult" };

export const courseTypeNames: Record<CourseType, string> = { ...patientTypeNames, "all-ages": "All ages" };

/** Whether the learner saw depth and rate while compressing. */
/** The two ways instructors are compared (shared/filters.ts `adjustModes`). */
export const adjustNames = {
  "case-mix": "Adjusted for case mix",
  none: "Not adjusted (crude)",
} as const;

export const feedbackNames: Record<FeedbackMode, string> = { live: "Live display", hidden: "Hidden display" };

/** Each error an attempt can fail on: a short name (axes, badges, filters) and what it means (tables, text). */
export const errorVocabulary: Record<AttemptError, { short: string; label: string }> = {
  too_shallow: { short: "Too shallow", label: "Compressions mostly not deep enough" },
  too_deep: { short: "Too deep", label: "Compressions mostly deeper than the target" },
  too_slow: { short: "Too slow", label: "Compression rate mostly below the target" },
  too_fast: { short: "Too fast", label: "Compression rate mostly above the target" },
  incomplete_recoil: { short: "Incomplete release", label: "Chest not released fully between compressions" },
  low_hands_on: { short: "Low hands-on time", label: "Too little of the time spent compressing" },
  long_pause: { short: "Long interruption", label: "An interruption longer than allowed" },
};

export const errorShortNames = Object.fromEntries(Object.entries(errorVocabulary).map(([error, words]) => [error, words.short])) as Record<
  AttemptError,
  string
>;
export const errorLabels = Object.fromEntries(Object.entries(errorVocabulary).map(([error, words]) => [error, words.label])) as Record<AttemptError, string>;

/** The headline figures, named the same on every page, in the report and the CLI. */
export const figureNames = {
  /** Attempts that met every measured criterion, of attempts measured by a manikin. */
  passRate: "Measured pass rate",
  /** Learners the instructor recorded as completing, of learners in the class logs. */
  recordedCompletion: "Recorded completion",
  attempts: "Attempts measured",
  learners: "Learners",
  classes: "Classes",
  medianScore: "Median score",
  agreement: "Agreement of instructors with the measurement",
} as const;

/** What an attempt's columns are called in the attempt list, its column chooser and its CSV export. */
export const attemptFieldNames = {
  id: "Attempt",
  startedAt: "Started",
  quarter: dimensionNames.period,
  class: "Class",
  learner: "Learner",
  site: dimensionNames.site,
  instructor: dimensionNames.instructor,
  manikin: dimensionNames.manikin,
  profile: dimensionNames.patientType,
  feedback: dimensionNames.feedback,
  passed: "Result",
  instructorResult: "Instructor’s result",
  score: "Score",
  errors: "Errors",
  stream: "Compression stream",
  compressions: "Compressions",
  duration: "Duration (s)",
  depth: "Mean depth",
  depthOk: "Depth on target (%)",
  tooShallow: "Too shallow (%)",
  tooDeep: "Too deep (%)",
  rate: "Rate (/min)",
  rateOk: "Rate on target (%)",
  tooSlow: "Too slow (%)",
  tooFast: "Too fast (%)",
  recoilOk: "Full recoil (%)",
  handsOn: "Hands-on (%)",
  longestPause: "Longest pause (s)",
  policyVersion: "Policy version",
} as const;

/** An attempt's result against the pass rule, and the instructor's own result, in words. */
export const resultNames = { passed: "Passed", notPassed: "Not passed" } as const;

/** Skill retention across recertifications: the groups of the retention page, the report and the CLI. */
export const retentionGroupNames: Record<RetentionBin | "first_time", string> = {
  first_time: "First course in the data",
  "0-6": "Back within 6 months",
  "6-12": "Back after 6–12 months",
  "12-18": "Back after 12–18 months",
  "18-24": "Back after 18–24 months",
  "24+": "Back after 24 months or more",
};
export const retentionFigureName = "First-attempt pass rate";

/** Manikin drift: a manikin's depth readings against the other manikins of its patient type in the same classes. */
export const driftFlagNames: Record<DriftFlag, string> = {
  check: "Check the depth sensor",
  ok: "In line with its peers",
  "too few classes": "Too few shared classes to judge",
};
export const driftOffsetName = "Depth offset against peers";

/** The lines of a manikin's equipment log. */
export const equipmentEventNames: Record<EquipmentEventType, string> = {
  commissioned: "Put into use",
  lung_replaced: "Lung replaced",
  mouthpiece_cleaned: "Mouthpiece cleaned",
  battery_replaced: "Battery replaced",
  serviced: "Serviced",
  fault: "Fault reported",
  retired: "Retired",
};

/** An instructor's pass/fail against the measurement. */
export const calibrationNames = {
  lenient: "Measured failures passed",
  strict: "Measured passes failed",
  kappa: "Agreement (κ)",
} as const;

/** What an improvement action can aim at: the measured pass rate, or the share of attempts failing on one error. */
export type AimFigure = "passRate" | AttemptError;

/** An aim's name, and whether the network wants it to go up or down. */
export function aimFigureName(aim: AimFigure): string {
  return aim === "passRate" ? figureNames.passRate : `Attempts failing on “${errorVocabulary[aim].short}”`;
}
export function aimGoesUp(aim: AimFigure): boolean {
  return aim === "passRate";
}

export const actionStatusNames: Record<ActionStatus, string> = {
  planned: "Planned",
  under_way: "Under way",
  done: "Done",
  stopped: "Stopped",
};

/** An action's evaluation in one phrase: the aim after the start against before it; null until both sides have attempts. */
export function actionVerdictName(verdict: "up" | "down" | "no clear change" | null): string {
  if (verdict === null) return "Not known yet";
  return verdict === "up" ? "Higher after the start" : verdict === "down" ? "Lower after the start" : "No clear change";
}

/** The wording of improvement actions and their evaluation. */
export const actionWords = {
  action: "Improvement action",
  aim: "Aim",
  target: "Target",
  scope: "Scope",
  network: "Whole network",
  startDate: "Start date",
  owner: "Owner",
  status: "Status",
  verdict: "Evaluation",
  notes: "Notes",
  before: "Before the action",
  after: "After the action",
  /** Why the comparison does not prove the action caused a change. */
  caution:
    "A before/after comparison of observed data is not proof that the action caused a change: other things change over time too. " +
    "A difference is called higher or lower only when its 95 % interval excludes zero.",
} as const;
