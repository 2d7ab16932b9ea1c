// Answers of the network-insight API (/api/insight/*, /api/classes/:id, /api/attempts*). Every rate carries its
// Wilson 95 % interval. A group smaller than the policy's suppressionMinCount, shown to someone who may only
// see it as an aggregate (an instructor looking at others, a funder), comes back with null values and
// `suppressed: true`.
import { z } from "zod";
import { courseTypes, feedbackModes } from "../domain";
import { adjustParamSchema } from "../filters";
import { chartLimitModes } from "./chartSettings";
import { bandSchema, passRuleSchema, patientTypes } from "../scoring/policy";
import { attemptErrorNames } from "../scoring/scoreAttempt";

const count = z.number().int().min(0);
const share = z.number().min(0).max(1);

export const periodSchema = z.object({
  from: z.string(),
  to: z.string(),
  /** Every quarter of the period, oldest first. */
  quarters: z.array(z.string()),
});
export type Period = z.infer<typeof periodSchema>;

/** successes out of n with the Wilson 95 % interval [low, high]; all null when n is 0 or the group is hidden. */
export const rateSchema = z.object({
  successes: count.nullable(),
  n: count.nullable(),
  rate: share.nullable(),
  low: share.nullable(),
  high: share.nullable(),
  suppressed: z.boolean(),
});
export type Rate = z.infer<typeof rateSchema>;

export const funnelPositions = ["inside", "above95", "below95", "above998", "below998"] as const;
export const funnelPositionSchema = z.enum(funnelPositions);

/** Funnel limits around the network rate at n attempts (normal approximation, widened by `scale`). */
export const funnelCurvePointSchema = z.object({
  n: count,
  low95: share,
  high95: share,
  low998: share,
  high998: share,
});

export const funnelSchema = z.object({
  /** The network pass rate the limits are drawn around (null without attempts or when hidden). */
  networkRate: share.nullable(),
  /** Limits at ±1.959964 and ±3.090232 standard errors (times `scale`) around the network rate. */
  method: z.literal("normal"),
  /** `case-mix`: instructors placed at their adjusted rate and effective number of attempts; `none`: as measured. */
  adjust: adjustParamSchema,
  /** Winsorised mean squared z-score (Spiegelhalter 2005); null with fewer than two instructors or when hidden. */
  phi: z.number().min(0).nullable(),
  /** I·φ above the 95th percentile of χ² with I − 1 degrees of freedom: limits widened by √φ. */
  overdispersed: z.boolean(),
  /** What the limits were multiplied by: √φ when overdispersed, else 1. */
  scale: z.number().min(0),
  curve: z.array(funnelCurvePointSchema),
});

/** An instructor's comparison with the network: passes expected from their case mix, and the z-score. */
export const funnelComparisonSchema = z.object({
  /** Σ attempts × network rate of the stratum (one stratum when not adjusted); null when hidden. */
  expected: z.number().min(0).nullable(),
  /** (observed − expected) / √variance; null without variation or when hidden. */
  z: z.number().nullable(),
  /** Network rate + (observed − expected) / attempts: where the point is drawn. */
  adjustedRate: share.nullable(),
  /** Attempts at which plain limits give this z: the point's position along the funnel. */
  effectiveAttempts: z.number().min(0).nullable(),
  position: funnelPositionSchema.nullable(),
});

export const errorNameSchema = z.enum(attemptErrorNames);

/** One bar of the error Pareto: share = of all errors counted, attemptShare = of attempts. */
export const paretoRowSchema = z.object({
  error: errorNameSchema,
  label: z.string(),
  count,
  share,
  cumulativeShare: share,
  attemptShare: share,
});

export const paretoSchema = z.object({
  attempts: count.nullable(),
  rows: z.array(paretoRowSchema),
  suppressed: z.boolean(),
});

// ---- GET /api/insight/options -------------------------------------------------------------------------

export const optionsAnswerSchema = z.object({
  /** Quarters with attempts, newest first. */
  quarters: z.array(z.string()),
  sites: z.array(z.object({ id: z.number(), code: z.string(), name: z.string() })),
  patientTypes: z.array(z.enum(patientTypes)),
  feedbackModes: z.array(z.enum(feedbackModes)),
  errors: z.array(z.object({ name: errorNameSchema, label: z.string() })),
  /** Drill-down roles: every instructor; an instructor: only themselves; a funder: none. */
  instructors: z.array(z.object({ id: z.number(), code: z.string(), name: z.string(), siteId: z.number().nullable() })),
  /** Drill-down roles: every manikin; an instructor: the manikins of their site; a funder: none. */
  manikins: z.array(z.object({ id: z.number(), assetId: z.string(), patientType: z.enum(patientTypes).nullable(), siteId: z.number().nullable() })),
});
export type OptionsAnswer = z.infer<typeof optionsAnswerSchema>;

// ---- GET /api/insight/overview ------------------------------------------------------------------------

export const seriesPointSchema = z.object({
  quarter: z.string(),
  attempts: count.nullable(),
  passed: count.nullable(),
  rate: share.nullable(),
  low: share.nullable(),
  high: share.nullable(),
  /** p-chart 3-sigma limits around the baseline's centre for this quarter's number of attempts (× σ_z with Laney's p′). */
  lcl: share.nullable(),
  ucl: share.nullable(),
  outside: z.boolean(),
  suppressed: z.boolean(),
});

export const passRateSeriesSchema = z.object({
  /** p̄ = Σpassed / Σattempts over the baseline quarters (Montgomery p-chart); null without attempts there or when hidden. */
  centre: share.nullable(),
  /** The quarters the centre and limits come from: a coordinator's setting or the first four with attempts. */
  baseline: z.object({ from: z.string().nullable(), to: z.string().nullable(), source: z.enum(["setting", "default"]), attempts: count.nullable() }),
  /** `laney`: limits widened by Laney's σ_z (Laney 2002), estimated from the baseline's quarters. */
  limits: z.enum(chartLimitModes),
  sigmaZ: z.number().nullable(),
  points: z.array(seriesPointSchema),
  /**
   * The chart split at a date (an improvement action's start): the quarters from the first whole quarter on
   * or after it form a phase of their own, whose centre and limits come from its first four quarters with
   * attempts (`baseline`). Until the phase has four, its quarters are judged against the limits before the
   * split and `centre` is null. The centre before the split comes from baseline quarters before it only.
   */
  split: z
    .object({
      date: z.string(),
      quarter: z.string(),
      centre: share.nullable(),
      baseline: z.object({ from: z.string(), to: z.string(), attempts: count }).nullable(),
      sigmaZ: z.number().nullable(),
    })
    .nullable(),
  /**
   * Run-chart rules over the shown quarters' rates around their median (Anhøj & Olesen 2014): the longest
   * run on one side and the crossings, with their limits; null for fewer than two quarters off the median.
   * With a split, the median is that of the quarters before it, carried on (a shift after it signals).
   */
  runChart: z.object({ median: share, useful: count, run: count, longestRun: count, crossings: count, fewestCrossings: count, shift: z.boolean() }).nullable(),
});

export const agreementSchema = z.object({
  /** Attempts with both an instructor's result and Quarterbeat's. */
  pairs: count.nullable(),
  /** [[both pass, instructor pass / Quarterbeat fail], [instructor fail / Quarterbeat pass, both fail]]. */
  table: z.tuple([z.tuple([count, count]), z.tuple([count, count])]).nullable(),
  observed: share.nullable(),
  expected: share.nullable(),
  kappa: z.number().nullable(),
  suppressed: z.boolean(),
});

export const feedbackGroupSchema = z.object({
  mode: z.enum(feedbackModes),
  attempts: count.nullable(),
  passRate: rateSchema,
  medianScore: z.number().nullable(),
  suppressed: z.boolean(),
});

export const overviewAnswerSchema = z.object({
  period: periodSchema,
  previousPeriod: periodSchema,
  suppressionMinCount: z.number().int(),
  suppressed: z.boolean(),
  learners: count.nullable(),
  classes: count.nullable(),
  attempts: count.nullable(),
  passRate: rateSchema,
  passRateChange: z.object({
    previous: rateSchema,
    /** Difference of the two rates (fraction points); relative = difference / previous. */
    absolute: z.number().nullable(),
    relative: z.number().nullable(),
    /** 95 % interval of the difference (Newcombe's hybrid score); null when either rate is hidden or empty. */
    low: z.number().nullable(),
    high: z.number().nullable(),
    /** "up" or "down" only when that interval excludes zero. */
    verdict: z.enum(["up", "down", "no clear change"]).nullable(),
  }),
  /**
   * Per learner (pseudonymous code) rather than per attempt: learners measured, those whose first attempt of
   * the period passed, and those who passed at least once — the like-for-like figure beside recorded completion.
   */
  learnerOutcomes: z.object({ measured: count.nullable(), firstAttempt: rateSchema, everPassed: rateSchema }),
  /** Σ passed / Σ learners over the class logs of the period: what instructors recorded. */
  recordedCompletion: rateSchema,
  agreement: agreementSchema,
  medianScore: z.number().nullable(),
  series: passRateSeriesSchema,
  errors: paretoSchema,
  feedback: z.array(feedbackGroupSchema),
});
export type OverviewAnswer = z.infer<typeof overviewAnswerSchema>;

// ---- GET /api/insight/standing ------------------------------------------------------------------------

export const standingMetricKeys = ["score", "depth_ok_pct", "rate_ok_pct", "recoil_ok_pct", "hands_on_pct"] as const;
export const standingMetricSchema = z.object({
  key: z.enum(standingMetricKeys),
  mine: z.number().nullable(),
  network: z.number().nullable(),
  /**
   * Percentile rank (0–100) of my median among the instructors' medians. Adjusted for case mix: ranked within
   * each patient type × feedback display among the instructors' medians there, averaged by my attempts in each.
   * Where the network's median is 100 %, ranked by the share of attempts at 100 % instead (see `ceiling`).
   */
  percentileRank: z.number().nullable(),
  /**
   * Set where the network's median sits at 100 % (a ceiling: most attempts are there): the share of attempts at
   * 100 % and the 10th percentile, mine and the network's (null when hidden), to show instead of the medians.
   */
  ceiling: z
    .object({
      mine: z.object({ shareAtCeiling: share.nullable(), p10: z.number().nullable() }),
      network: z.object({ shareAtCeiling: share.nullable(), p10: z.number().nullable() }).nullable(),
    })
    .nullable(),
});

export const spreadPointSchema = z.object({
  medianScore: z.number(),
  passRate: share,
  isMe: z.boolean(),
});

export const classRowSchema = z.object({
  id: z.string(),
  date: z.string(),
  course: z.enum(courseTypes),
  learners: count,
  /** Learners the instructor recorded as passed. */
  passed: count,
  attempts: count,
  /** Quarterbeat's pass rate over the class's attempts. */
  passRate: rateSchema,
});
export type ClassRow = z.infer<typeof classRowSchema>;

export const standingAnswerSchema = z.object({
  period: periodSchema,
  me: z.object({ instructorId: z.number(), code: z.string(), name: z.string() }),
  suppressionMinCount: z.number().int(),
  attempts: count,
  metrics: z.array(standingMetricSchema),
  spread: z.object({
    /** Instructors with fewer attempts than this are left out (only I am always shown). */
    minAttempts: z.number().int(),
    points: z.array(spreadPointSchema),
    instructorsLeftOut: count,
  }),
  funnel: funnelSchema.extend({
    me: rateSchema.merge(funnelComparisonSchema),
  }),
  errorProfile: z.object({
    networkSuppressed: z.boolean(),
    rows: z.array(z.object({ error: errorNameSchema, label: z.string(), mine: share.nullable(), network: share.nullable() })),
  }),
  classes: z.array(classRowSchema),
});
export type StandingAnswer = z.infer<typeof standingAnswerSchema>;

// ---- GET /api/insight/instructors and /api/insight/instructors/:id -------------------------------------

export const instructorRowSchema = z
  .object({
    id: z.number(),
    code: z.string(),
    name: z.string(),
    site: z.object({ id: z.number(), code: z.string() }).nullable(),
    classes: count,
    attempts: count,
    passRate: rateSchema,
    medianScore: z.number().nullable(),
  })
  .merge(funnelComparisonSchema);

export const instructorsAnswerSchema = z.object({
  period: periodSchema,
  funnel: funnelSchema,
  instructors: z.array(instructorRowSchema),
});
export type InstructorsAnswer = z.infer<typeof instructorsAnswerSchema>;

export const instructorDetailAnswerSchema = z.object({
  period: periodSchema,
  instructor: z.object({ id: z.number(), code: z.string(), name: z.string(), site: z.object({ id: z.number(), code: z.string() }).nullable() }),
  trend: z.array(z.object({ quarter: z.string(), passRate: rateSchema, medianScore: z.number().nullable() })),
  classes: z.array(classRowSchema),
});
export type InstructorDetailAnswer = z.infer<typeof instructorDetailAnswerSchema>;

// ---- GET /api/insight/errors ---------------------------------------------------------------------------

export const breakdownRowSchema = z.object({
  /** profile or feedback name, site/instructor code, manikin asset id ("(none)" when not recorded). */
  key: z.string(),
  id: z.number().nullable(),
  count,
  attempts: count,
  share,
});

export const techniqueErrorsAnswerSchema = z.object({
  period: periodSchema,
  pareto: paretoSchema,
  selected: z
    .object({
      error: errorNameSchema,
      label: z.string(),
      trend: z.array(z.object({ quarter: z.string(), count, attempts: count, share: share.nullable(), low: share.nullable(), high: share.nullable() })),
      byProfile: z.array(breakdownRowSchema),
      byFeedback: z.array(breakdownRowSchema),
      bySite: z.array(breakdownRowSchema),
      byInstructor: z.array(breakdownRowSchema),
      byManikin: z.array(breakdownRowSchema),
    })
    .nullable(),
});
export type TechniqueErrorsAnswer = z.infer<typeof techniqueErrorsAnswerSchema>;

// ---- GET /api/attempts, /api/attempts/:id, /api/classes/:id --------------------------------------------

export const attemptMetricsSchema = z.object({
  durationS: z.number(),
  compressions: count,
  rateCpm: z.number(),
  depthMm: z.number(),
  depthOkPct: z.number(),
  tooShallowPct: z.number(),
  tooDeepPct: z.number(),
  rateOkPct: z.number(),
  tooSlowPct: z.number(),
  tooFastPct: z.number(),
  recoilOkPct: z.number(),
  handsOnPct: z.number(),
  longestPauseS: z.number(),
  pauses: count.nullable(),
  pausesOver10s: count.nullable(),
});

export const attemptRowSchema = z.object({
  id: z.string(),
  classId: z.string(),
  learner: z.string(),
  startedAt: z.string(),
  quarter: z.string(),
  profile: z.enum(patientTypes),
  feedback: z.enum(feedbackModes),
  site: z.object({ id: z.number(), code: z.string() }).nullable(),
  instructor: z.object({ id: z.number(), code: z.string() }).nullable(),
  manikin: z.object({ id: z.number(), assetId: z.string() }).nullable(),
  metrics: attemptMetricsSchema,
  score: z.number(),
  passed: z.boolean(),
  instructorResult: z.enum(["pass", "fail"]).nullable(),
  errors: z.array(errorNameSchema),
  policyVersion: z.number().int(),
  source: z.enum(["summary", "stream"]),
  hasStream: z.boolean(),
});
export type AttemptRow = z.infer<typeof attemptRowSchema>;

export const attemptListAnswerSchema = z.object({
  page: z.number().int(),
  pageSize: z.number().int(),
  total: count,
  attempts: z.array(attemptRowSchema),
});
export type AttemptListAnswer = z.infer<typeof attemptListAnswerSchema>;

/** The metrics whose network distribution an attempt is placed in (those the summaries keep). */
export const placedMetrics = ["score", "depthOkPct", "rateOkPct", "recoilOkPct", "handsOnPct"] as const;
export type PlacedMetric = (typeof placedMetrics)[number];

/**
 * Where an attempt sits among the network's attempts of the same patient type and quarter: for each metric,
 * the share of those attempts below it, ties counted half (a mid-rank percentile, 0–100). Null when the
 * group is hidden from the viewer (too few of other people's attempts).
 */
export const attemptPlacementSchema = z.object({
  quarter: z.string(),
  profile: z.enum(patientTypes),
  /** Attempts in the group, this one included; null when hidden. */
  attempts: count.nullable(),
  hidden: z.boolean(),
  percentiles: z.object({
    score: z.number().nullable(),
    depthOkPct: z.number().nullable(),
    rateOkPct: z.number().nullable(),
    recoilOkPct: z.number().nullable(),
    handsOnPct: z.number().nullable(),
  }),
});
export type AttemptPlacement = z.infer<typeof attemptPlacementSchema>;

export const attemptDetailAnswerSchema = z.object({
  attempt: attemptRowSchema,
  /** The rules of the policy version that scored the attempt, for its patient type; null if that version is gone. */
  scoring: z
    .object({
      passRule: passRuleSchema,
      band: bandSchema,
      pauseThresholdS: z.number(),
      longPauseLimitS: z.number(),
    })
    .nullable(),
  placement: attemptPlacementSchema,
  errorLabels: z.array(z.object({ error: errorNameSchema, label: z.string() })),
  scoreHistory: z.array(
    z.object({ policyVersion: z.number().int(), score: z.number(), passed: z.boolean(), errors: z.array(errorNameSchema), replacedAt: z.string() }),
  ),
  stream: z
    .object({
      compressions: count,
      t_ms: z.array(z.number()),
      depth_mm: z.array(z.number()),
      release_mm: z.array(z.number()),
      /** The target band of the attempt's patient type under the policy version that scored it. */
      band: bandSchema,
    })
    .nullable(),
});
export type AttemptDetailAnswer = z.infer<typeof attemptDetailAnswerSchema>;

export const classDetailAnswerSchema = z.object({
  class: z.object({
    id: z.string(),
    date: z.string(),
    quarter: z.string(),
    course: z.enum(courseTypes),
    site: z.object({ id: z.number(), code: z.string() }),
    instructor: z.object({ id: z.number(), code: z.string(), name: z.string() }),
    learners: count,
    passed: count,
    manikins: z.array(z.string()),
    lungsReplaced: count.nullable(),
    mouthpiecesCleaned: count.nullable(),
    batteriesReplaced: count.nullable(),
  }),
  passRate: rateSchema,
  attempts: z.array(
    z.object({
      id: z.string(),
      learner: z.string(),
      startedAt: z.string(),
      profile: z.enum(patientTypes),
      feedback: z.enum(feedbackModes),
      score: z.number(),
      passed: z.boolean(),
      instructorResult: z.enum(["pass", "fail"]).nullable(),
      errors: z.array(errorNameSchema),
      hasStream: z.boolean(),
    }),
  ),
});
export type ClassDetailAnswer = z.infer<typeof classDetailAnswerSchema>;
