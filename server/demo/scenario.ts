// The story of the demo network, in one place. Everything here is invented: the region, places, people,
// manikins and the notes. Dates are written for the reference day below; when the generator is run for
// another "today", dated events move by the same number of days and quarter-based events by the same
// number of quarters, so the story keeps its shape.
//
// The story the screens should find:
// - Infant attempts are most often too shallow; adult attempts most often too fast or leaning (incomplete
//   recoil).
// - Attempts with the live display hidden score lower than attempts with it shown.
// - Two instructors sit outside the network's funnel: Desmond Quarrie's learners pass far less often,
//   Jonah Thistlecombe's far more often.
// - Instructors pass more learners by eye than the measurements do, mostly when the faults are ones the eye
//   cannot see (depth, recoil).
// - The network ran a refresher for all instructors in 2026-Q1; from 2026-Q2 the results are clearly better.
// - Equipment: lungs, mouthpieces and batteries replaced after classes, a yearly service per site, a few
//   faults (two still open), one infant manikin retired and replaced, one manikin overdue for its service,
//   and a site that cleaned too few mouthpieces until the autumn of 2025.
// - Learners come back for recertification 6 to 30 months after their previous class; the longer the gap,
//   the less often their first attempt passes.
// - One adult manikin's depth sensor reads 4 mm deep from the autumn of 2025 on.
// - One instructor passes most learners whatever the measurement says.
// - The quality lead recorded two improvement actions: the refresher, whose pass rate clearly rose after it,
//   and depth feedback cards on one site's adult manikins, which left the share of too-shallow attempts
//   where it was.
import type { ActionStatus, CourseType, UserRole } from "../../shared/domain";
import type { AimFigure } from "../../shared/vocabulary";
import type { PatientType } from "../../shared/scoring/policy";

export interface ScenarioSite {
  code: string;
  name: string;
  /** Day of the yearly service of the site's manikins (MM-DD). */
  serviceDay: string;
}

export interface ScenarioInstructor {
  code: string;
  name: string;
  site: string;
  /** Added to every learner's skill in this instructor's classes (0 = typical; within ±0.1 is ordinary). */
  skill: number;
  /** Relative share of the network's classes this instructor teaches. */
  workload: number;
}

export interface ScenarioAccount {
  role: UserRole;
  displayName: string;
  /** Part of the e-mail address before the @; the domain is `emailDomain`. */
  mailbox: string;
  /** Instructor code the account belongs to (instructor accounts only). */
  instructor: string | null;
}

export interface ScenarioIncident {
  manikin: string;
  fault: string; // YYYY-MM-DD on the reference calendar
  faultNote: string;
  /** Repaired (a "serviced" event) on this day; without it or `retired` the fault is still open. */
  repaired?: string;
  repairNote?: string;
  retired?: string;
  retiredNote?: string;
}

export interface ScenarioProfileTendency {
  /** How far below the middle of the depth band an untrained learner compresses (mm). */
  depthShortfallMm: number;
  /** Spread of learners' mean depth (mm). */
  depthSpreadMm: number;
  /** Compression-to-compression depth noise (mm). */
  depthNoiseMm: number;
  /** Depth lost from the first to the last compression as the learner tires (mm, at most). */
  fatigueMm: number;
  /** How far above 110/min an untrained learner pushes (per minute). */
  rateExcessCpm: number;
  /** Share of untrained learners who lean on the chest between compressions. */
  leanChance: number;
}

export interface ScenarioAction {
  title: string;
  aim: AimFigure;
  /** Target, percent. */
  target: number;
  site: string | null;
  profile: PatientType | null;
  /** YYYY-MM-DD on the reference calendar; moves by whole quarters with the story, like the refresher. */
  startDate: string;
  status: ActionStatus;
  /** Dated notes (reference calendar, moved like the start). */
  notes: { date: string; text: string }[];
}

export interface DemoScenario {
  defaultSeed: number;
  referenceToday: string;
  network: { name: string; region: string };
  emailDomain: string;
  demoPassword: string;
  historyQuarters: number;
  sites: ScenarioSite[];
  instructors: ScenarioInstructor[];
  accounts: ScenarioAccount[];
  fleet: {
    /** Manikins each site starts with; asset ids are `<site>-<A|C|I><nn>`. */
    perSite: Record<string, Record<PatientType, number>>;
    /** Manikins that join later (YYYY-MM-DD on the reference calendar). */
    arrivals: { manikin: string; site: string; patientType: PatientType; commissioned: string; note: string }[];
    incidents: ScenarioIncident[];
    /** This manikin misses its most recent yearly service, so it is overdue today. */
    overdueService: string;
  };
  classes: {
    /** Classes in the first (full) quarter, and how many more each later quarter. */
    firstQuarter: number;
    growthPerQuarter: number;
    learners: [number, number];
    courseMix: Record<CourseType, number>;
    /** Share of an instructor's classes taught at their own site. */
    homeSiteShare: number;
    /** Classes whose manikins' data never reached the network (class log only). */
    withoutAttemptData: number;
  };
  attempts: {
    /** Extra attempts a learner may make on one patient type (each with this chance). */
    extraAttemptChance: [number, number];
    liveFeedbackShare: number;
    compressions: [number, number];
    /** Attempts exported as full compression streams instead of summaries. */
    streams: number;
  };
  performance: {
    profiles: Record<PatientType, ScenarioProfileTendency>;
    /** Spread of learners' own skill, and of the same learner from one attempt to the next. */
    learnerSpread: number;
    attemptSpread: number;
    /** Skill added when the live display is shown. */
    liveFeedbackBoost: number;
    /** Skill added per earlier attempt of the same learner on the same patient type. */
    practiceBoost: number;
    /** Interruptions per attempt for an untrained learner, each this many seconds long. */
    pausesPerAttempt: number;
    pauseSeconds: [number, number];
  };
  /** All instructors took a refresher in this quarter; learners are a little better during it, clearly after. */
  refresher: { quarter: string; skillDuring: number; skillAfter: number };
  /** Improvement actions the quality lead recorded; the first is the refresher, starting on its quarter's first day. */
  improvementActions: ScenarioAction[];
  /** How instructors judge by eye (they see rate and pauses, hardly depth or recoil). */
  judgement: {
    passWhenMeasuredPass: number;
    passWhenOnlyUnseenFaults: number;
    passWhenVisibleFaults: number;
    /** Attempts left without an instructor result. */
    emptyWhenLive: number;
    emptyWhenHidden: number;
  };
  /**
   * Learners who return for recertification. A learner of a class takes on the code of an earlier learner
   * whose last class was `months` ago; whether they do depends on the gap and on their first attempt in the
   * new class (the keep chances, interpolated linearly in months), so longer gaps go with more first-attempt
   * failures — the fade the retention figures should find.
   */
  returns: {
    share: number;
    months: [number, number];
    keepWhenPassed: [number, number];
    keepWhenFailed: [number, number];
  };
  /** A manikin whose depth readings are this many mm too deep from a day on (YYYY-MM-DD, reference calendar). */
  driftingSensor: { manikin: string; from: string; depthMm: number };
  /** An instructor who passes most attempts whatever the measurement (chances replace `judgement`'s). */
  lenientInstructor: { code: string; passWhenOnlyUnseenFaults: number; passWhenVisibleFaults: number };
  consumables: {
    lungChance: number;
    secondLungChance: number;
    batteryChance: number;
    /** Classes whose log leaves the three consumables columns empty. */
    notLogged: number;
    mouthpiecesPerLearner: [number, number];
    /** A site that cleaned too few mouthpieces until (and including) a quarter. */
    cleaningGap: { site: string; untilQuarter: string; perLearner: [number, number] };
  };
}

export const DEMO_SCENARIO: DemoScenario = {
  defaultSeed: 20261201,
  referenceToday: "2026-12-01",
  network: { name: "Harrowmere Valley CPR Training Network", region: "Harrowmere Valley" },
  emailDomain: "harrowmere-cpr.example",
  demoPassword: "harrowmere-demo-2026",
  historyQuarters: 8,

  sites: [
    { code: "WRM", name: "Wrenmoor Learning Centre", serviceDay: "03-12" },
    { code: "CLB", name: "Callowby Fire Station Training Room", serviceDay: "05-20" },
    { code: "FNX", name: "Fennick Cross Community Clinic", serviceDay: "07-08" },
    { code: "LTQ", name: "Lantern Quay Village Hall", serviceDay: "09-16" },
  ],

  instructors: [
    { code: "IN01", name: "Maren Oakhill", site: "WRM", skill: 0.08, workload: 1.2 },
    { code: "IN02", name: "Teodor Vashby", site: "WRM", skill: -0.05, workload: 1 },
    { code: "IN03", name: "Ilse Pendrake", site: "WRM", skill: 0.03, workload: 1.1 },
    { code: "IN04", name: "Callum Ferrowin", site: "CLB", skill: 0.05, workload: 0.9 },
    { code: "IN05", name: "Anouk Brightwater", site: "CLB", skill: -0.08, workload: 1 },
    // Far below the network: learners rarely meet the targets.
    { code: "IN06", name: "Desmond Quarrie", site: "CLB", skill: -1.4, workload: 1.1 },
    { code: "IN07", name: "Priya Lanthorne", site: "FNX", skill: 0.1, workload: 1 },
    // Far above the network.
    { code: "IN08", name: "Jonah Thistlecombe", site: "FNX", skill: 1.3, workload: 1.1 },
    { code: "IN09", name: "Sofia Marrable", site: "FNX", skill: -0.03, workload: 0.8 },
    { code: "IN10", name: "Elias Wendricks", site: "LTQ", skill: 0, workload: 1 },
    { code: "IN11", name: "Noor Haverleigh", site: "LTQ", skill: -0.1, workload: 0.9 },
    { code: "IN12", name: "Bettina Corrow", site: "LTQ", skill: 0.05, workload: 0.9 },
  ],

  accounts: [
    { role: "coordinator", displayName: "Rowan Ellery", mailbox: "rowan.ellery", instructor: null },
    { role: "quality_lead", displayName: "Imogen Tarrow", mailbox: "imogen.tarrow", instructor: null },
    { role: "instructor", displayName: "Ilse Pendrake", mailbox: "ilse.pendrake", instructor: "IN03" },
    { role: "funder", displayName: "Gideon Maybrook", mailbox: "gideon.maybrook", instructor: null },
  ],

  fleet: {
    perSite: {
      WRM: { adult: 4, child: 2, infant: 4 },
      CLB: { adult: 4, child: 2, infant: 3 },
      FNX: { adult: 4, child: 2, infant: 4 },
      LTQ: { adult: 4, child: 2, infant: 4 },
    },
    arrivals: [
      {
        manikin: "CLB-I04",
        site: "CLB",
        patientType: "infant",
        commissioned: "2026-02-05",
        note: "Replaces CLB-I02",
      },
    ],
    incidents: [
      {
        manikin: "WRM-A03",
        fault: "2025-06-03",
        faultNote: "Depth readings drop out mid-attempt; sensor cable loose",
        repaired: "2025-06-10",
        repairNote: "Sensor cable re-seated and strain relief fitted",
      },
      {
        manikin: "CLB-I02",
        fault: "2025-10-14",
        faultNote: "Chest plate cracked near the hinge",
        repaired: "2025-10-28",
        repairNote: "Chest plate replaced",
      },
      {
        manikin: "CLB-I02",
        fault: "2026-01-22",
        faultNote: "Chest plate cracked again; depth readings unreliable",
        retired: "2026-02-05",
        retiredNote: "Beyond economical repair; replaced by CLB-I04",
      },
      {
        manikin: "FNX-C01",
        fault: "2026-04-17",
        faultNote: "Compression spring squeaks and sticks at the bottom",
        repaired: "2026-04-24",
        repairNote: "Spring and guide sleeve replaced",
      },
      {
        manikin: "LTQ-A02",
        fault: "2026-11-06",
        faultNote: "Does not power on; corrosion in the battery compartment",
      },
      {
        manikin: "FNX-I03",
        fault: "2026-11-20",
        faultNote: "Head-tilt joint loose; airway will not stay open",
      },
    ],
    overdueService: "LTQ-C02",
  },

  classes: {
    firstQuarter: 35,
    growthPerQuarter: 1,
    learners: [4, 15],
    courseMix: { adult: 0.35, infant: 0.2, child: 0.15, "all-ages": 0.3 },
    homeSiteShare: 0.9,
    withoutAttemptData: 0.04,
  },

  attempts: {
    extraAttemptChance: [0.5, 0.12],
    liveFeedbackShare: 0.55,
    compressions: [60, 300],
    streams: 340,
  },

  performance: {
    profiles: {
      // Infants: learners hold back for fear of hurting a baby, so too shallow is the commonest fault.
      infant: {
        depthShortfallMm: 5,
        depthSpreadMm: 2.5,
        depthNoiseMm: 2.2,
        fatigueMm: 2,
        rateExcessCpm: 3,
        leanChance: 0.1,
      },
      child: {
        depthShortfallMm: 2.5,
        depthSpreadMm: 2.5,
        depthNoiseMm: 2.6,
        fatigueMm: 3,
        rateExcessCpm: 5,
        leanChance: 0.2,
      },
      // Adults: depth is usually reached, but learners rush and lean.
      adult: {
        depthShortfallMm: 0,
        depthSpreadMm: 2.5,
        depthNoiseMm: 2.8,
        fatigueMm: 3,
        rateExcessCpm: 9,
        leanChance: 0.4,
      },
    },
    learnerSpread: 0.6,
    attemptSpread: 0.35,
    liveFeedbackBoost: 0.8,
    practiceBoost: 0.15,
    pausesPerAttempt: 0.6,
    pauseSeconds: [3, 12],
  },

  refresher: { quarter: "2026-Q1", skillDuring: 0.1, skillAfter: 0.7 },

  improvementActions: [
    {
      title: "Refresher on depth, rate and recoil for every instructor",
      aim: "passRate",
      target: 35,
      site: null,
      profile: null,
      startDate: "2026-01-01",
      status: "done",
      notes: [
        { date: "2026-02-16", text: "Two thirds of the instructors have taken the refresher session; the rest are booked for March." },
        { date: "2026-03-30", text: "Every instructor has taken the refresher." },
      ],
    },
    {
      title: "Depth feedback cards on the adult manikins at Wrenmoor",
      aim: "too_shallow",
      target: 10,
      site: "WRM",
      profile: "adult",
      startDate: "2026-05-01",
      status: "stopped",
      notes: [{ date: "2026-10-12", text: "Stopped: the share of too-shallow adult attempts has not moved; the cards are being rethought." }],
    },
  ],

  judgement: {
    passWhenMeasuredPass: 0.93,
    passWhenOnlyUnseenFaults: 0.72,
    passWhenVisibleFaults: 0.35,
    emptyWhenLive: 0.18,
    emptyWhenHidden: 0.04,
  },

  returns: { share: 0.35, months: [6, 30], keepWhenPassed: [1, 0], keepWhenFailed: [0.3, 1] },

  driftingSensor: { manikin: "LTQ-A03", from: "2025-10-06", depthMm: 4 },

  lenientInstructor: { code: "IN11", passWhenOnlyUnseenFaults: 0.97, passWhenVisibleFaults: 0.9 },

  consumables: {
    lungChance: 0.25,
    secondLungChance: 0.2,
    batteryChance: 0.06,
    notLogged: 0.04,
    mouthpiecesPerLearner: [1, 1.3],
    cleaningGap: { site: "LTQ", untilQuarter: "2025-Q3", perLearner: [0.5, 0.8] },
  },
};
