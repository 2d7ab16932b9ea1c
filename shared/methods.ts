// How Quarterbeat's figures are worked out, in plain words with their sources: shown on the Methods page and
// written out in docs/methods.md (a test holds the two to the same text). Add a method here when a figure
// gains one.

export interface MethodNote {
  id: string;
  title: string;
  /** What is done and why, in plain words. */
  text: string;
  /** Where the method comes from. */
  sources: string[];
}

export const methodNotes: readonly MethodNote[] = [
  {
    id: "pass-rate",
    title: "Pass rate and its 95 % interval",
    text: "A pass rate is passed attempts out of attempts measured by a manikin. Each rate carries the range the true rate very likely lies in, given how many attempts were counted: the Wilson score interval, which stays sensible for small groups and for rates near 0 % or 100 %.",
    sources: [
      "Wilson EB. Probable inference, the law of succession, and statistical inference. J Am Stat Assoc 1927;22:209–212.",
      "Newcombe RG. Two-sided confidence intervals for the single proportion. Stat Med 1998;17:857–872 (method 3).",
    ],
  },
  {
    id: "change",
    title: "Change between two periods",
    text: 'The difference between two pass rates gets its own 95 % interval (Newcombe\'s hybrid score interval). Quarterbeat calls a rate higher or lower only when that interval lies wholly on one side of zero; otherwise it says "no clear change". The same rule is used on every page, in the report and in the command line.',
    sources: ["Newcombe RG. Interval estimation for the difference between independent proportions. Stat Med 1998;17:873–890 (method 10)."],
  },
  {
    id: "learners",
    title: "Learners, not only attempts",
    text: 'Learners are counted by their pseudonymous code: how many were measured, how many passed their first attempt of the period (the earliest by start time) and how many passed at least once. Instructors\' recorded completion counts learners too, so it is set beside "passed at least once", never beside the rate per attempt.',
    sources: ["Common practice: compare like with like (per learner with per learner)."],
  },
  {
    id: "medians",
    title: "Medians, percentiles and ranks",
    text: "Medians and percentiles use the usual definition of statistical software (type 7: the value interpolated between the two nearest observations). A percentile rank counts the instructors below, plus half of those tied, out of all instructors compared.",
    sources: ["Hyndman RJ, Fan Y. Sample quantiles in statistical packages. Am Stat 1996;50:361–365."],
  },
  {
    id: "ceiling",
    title: "Measures that most attempts max out",
    text: "Full release (recoil) and hands-on time reach 100 % in most attempts, so their median is 100 % almost everywhere and ranks built on it are ties. Where the network's median is 100 %, Quarterbeat shows the share of attempts at 100 % and the 10th percentile (how low the weakest tenth of attempts falls) instead, and ranks instructors by the share at 100 %.",
    sources: ["Common practice for measures with a ceiling: report the share at the ceiling and a lower percentile."],
  },
  {
    id: "case-mix",
    title: "Comparing instructors fairly: case mix",
    text: "Infant, child and adult attempts, and attempts with the live display shown or hidden, pass at different rates, so an instructor's mix of learners changes their rate. By default instructors are compared with the passes expected from their own mix: for each patient type and feedback display, their attempts times the network's pass rate there, added up (indirect standardisation). The z-score is (observed − expected) divided by the square root of the summed binomial variances. Percentile ranks are taken within each patient type and display and averaged by the instructor's attempts in each. The unadjusted (crude) view is one click away.",
    sources: [
      "Indirect standardisation: common practice in comparing providers; see Spiegelhalter DJ. Funnel plots for comparing institutional performance. Stat Med 2005;24:1185–1202.",
    ],
  },
  {
    id: "funnel",
    title: "Funnel plots and overdispersion",
    text: "Each instructor's rate is drawn against their number of attempts, inside limits that narrow as attempts add up: 95 % (1.96 standard errors) and 99.8 % (3.09). Real instructors differ by more than chance alone, so the spread of their z-scores is measured: φ is the mean squared z-score after the most extreme tenth at each end is pulled in to the 10th and 90th percentiles. When the instructors vary more than chance allows (the number of instructors times φ is above the 95th percentile of the chi-squared distribution with one fewer degrees of freedom), the limits are widened by the square root of φ. The page says φ and whether the limits were widened.",
    sources: [
      "Spiegelhalter DJ. Funnel plots for comparing institutional performance. Stat Med 2005;24:1185–1202.",
      "Spiegelhalter DJ. Handling over-dispersion of performance indicators. Qual Saf Health Care 2005;14:347–351.",
    ],
  },
  {
    id: "control-chart",
    title: "Control chart of the pass rate by quarter",
    text: "The overview charts each quarter's pass rate around a centre line with limits of three standard errors for that quarter's number of attempts (a p-chart). The centre line and limits come from a stated baseline — the first four quarters with attempts, or quarters a coordinator chooses in Settings — so the quarters being judged never move their own centre line. With hundreds of attempts a quarter plain limits flag ordinary variation, so Laney's p′ chart can widen them by the spread of the baseline quarters' z-scores (their average moving range divided by 1.128). A reader can split the chart at an improvement action's start: the quarters from the first whole quarter after it form a phase of their own, whose centre and limits come from that phase's first four quarters with attempts; until it has four they are judged against the limits before the split, which asks whether the new quarters go beyond what the old process gave by chance. The funder report's chart takes the same baseline, cut at the report's last quarter.",
    sources: [
      "Montgomery DC. Introduction to Statistical Quality Control (p-chart, phase I baseline).",
      "Laney DB. Improved control charts for attributes. Quality Engineering 2002;14:531–537.",
    ],
  },
  {
    id: "run-chart",
    title: "Run-chart rules",
    text: "A shift is signalled when too many points in a row sit on one side of the median (more than log2(n) + 3, rounded, for n points off the median), or the series crosses the median too few times (fewer than the 5th percentile of a binomial distribution with n − 1 trials and one half), for the number of points shown. The points are quarters on the overview, and months on an improvement action's page and in the command line's trend command; an action's monthly chart takes a median of the months before its start and another of the months after it, and judges the months after the start against the median before it.",
    sources: ["Anhøj J, Olesen AV. Run charts revisited. PLoS One 2014;9:e113825."],
  },
  {
    id: "agreement",
    title: "Instructors' judgement against the measurement",
    text: "Where an instructor recorded a pass or fail, it is set against Quarterbeat's: the two-by-two table in words, Cohen's kappa with its 95 % interval, the prevalence- and bias-adjusted kappa (PABAK), and an exact McNemar test of whether the two kinds of disagreement (the instructor passing what the measurement failed, and the reverse) are equally common. Attempts without an instructor's judgement are counted and said.",
    sources: [
      "Cohen J. A coefficient of agreement for nominal scales. Educ Psychol Meas 1960;20:37–46.",
      "Fleiss JL, Cohen J, Everitt BS. Large sample standard errors of kappa and weighted kappa. Psychol Bull 1969;72:323–327.",
      "Byrt T, Bishop J, Carlin JB. Bias, prevalence and kappa. J Clin Epidemiol 1993;46:423–429.",
      "McNemar Q. Note on the sampling error of the difference between correlated proportions. Psychometrika 1947;12:153–157.",
    ],
  },
  {
    id: "small-cells",
    title: "Small groups",
    text: "Figures about fewer attempts than the network's threshold are hidden from those who may only see aggregates (instructors looking at others, funders), and further figures are hidden with them where a hidden one could otherwise be worked out by subtraction.",
    sources: ["Common practice in statistical disclosure control."],
  },
];
