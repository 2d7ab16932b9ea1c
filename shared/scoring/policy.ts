// The network policy: the targets each compression is judged against and the rule that decides whether an
// attempt passes. Guideline targets come with their source; everything else is a project default that a
// network may change (it is policy, not a guideline). Stored scores record the policy version that produced
// them, so changing the policy never silently rewrites history.
import { z } from "zod";

export const patientTypes = ["infant", "child", "adult"] as const;
export type PatientType = (typeof patientTypes)[number];

const positive = (what: string) => z.number({ error: `${what} must be a finite number` }).positive(`${what} must be greater than 0`);

const nonNegative = (what: string) => z.number({ error: `${what} must be a finite number` }).min(0, `${what} must not be negative`);

const percentage = (what: string) => nonNegative(what).max(100, `${what} is a percentage and must be at most 100`);

const wholePositive = (what: string) => positive(what).int(`${what} must be a whole number`);

export const bandSchema = z
  .object({
    depthMinMm: positive("Minimum depth (mm)"),
    depthMaxMm: positive("Maximum depth (mm)"),
    rateMin: positive("Minimum rate (per minute)"),
    rateMax: positive("Maximum rate (per minute)"),
    recoilMaxMm: nonNegative("Largest residual depth for full recoil (mm)"),
  })
  .refine((b) => b.depthMinMm <= b.depthMaxMm, {
    message: "Minimum depth must not exceed maximum depth",
    path: ["depthMaxMm"],
  })
  .refine((b) => b.rateMin <= b.rateMax, {
    message: "Minimum rate must not exceed maximum rate",
    path: ["rateMax"],
  })
  .refine((b) => b.recoilMaxMm < b.depthMinMm, {
    message: "The full-recoil tolerance must be smaller than the minimum depth",
    path: ["recoilMaxMm"],
  });
export type Band = z.infer<typeof bandSchema>;

export const passRuleSchema = z.object({
  minDepthOkPct: percentage("Minimum share of compressions at target depth (%)"),
  minRateOkPct: percentage("Minimum share of compressions at target rate (%)"),
  minRecoilOkPct: percentage("Minimum share of compressions with full recoil (%)"),
  minHandsOnPct: percentage("Minimum hands-on time (%)"),
  maxLongestPauseS: positive("Longest allowed pause (s)"),
});
export type PassRule = z.infer<typeof passRuleSchema>;

export const equipmentPolicySchema = z.object({
  serviceEveryCompressions: wholePositive("Compressions between services"),
  serviceEveryDays: wholePositive("Days between services"),
  minMouthpieceCleansPerLearner: nonNegative("Mouthpiece cleans per learner"),
  // policies saved before the drift check existed read as the defaults
  driftMinClasses: wholePositive("Shared classes before a manikin's depth readings are judged").default(5),
  driftMinOffsetMm: positive("Depth difference from peers worth a check (mm)").default(3),
});
export type EquipmentPolicy = z.infer<typeof equipmentPolicySchema>;

export const networkPolicySchema = z
  .object({
    bands: z.object({ infant: bandSchema, child: bandSchema, adult: bandSchema }),
    pauseThresholdS: positive("Pause threshold (s)"),
    longPauseLimitS: positive("Long-pause limit (s)"),
    passRule: passRuleSchema,
    suppressionMinCount: wholePositive("Smallest group shown"),
    // policies saved before this setting existed read as the default
    suppressionMinInstructors: wholePositive("Fewest other instructors in a group shown").default(3),
    equipment: equipmentPolicySchema,
  })
  .refine((p) => p.longPauseLimitS >= p.pauseThresholdS, {
    // Only gaps longer than the pause threshold are pauses, so a shorter long-pause limit could never count.
    message: "The long-pause limit must not be shorter than the pause threshold",
    path: ["longPauseLimitS"],
  });
export type NetworkPolicy = z.infer<typeof networkPolicySchema>;

export const DEFAULT_POLICY: NetworkPolicy = {
  bands: {
    // Infant: AHA 2020 Part 4 (pediatric BLS): about 1.5 in (4 cm), at least one third of the chest depth.
    // Band 35–45 mm = guideline value ± 5 mm (project default). Rate 100–120/min: AHA 2020, all ages.
    // Full recoil within 3 mm: project default (AHA 2020 asks for full recoil, no leaning, without a number).
    infant: { depthMinMm: 35, depthMaxMm: 45, rateMin: 100, rateMax: 120, recoilMaxMm: 3 },
    // Child: AHA 2020 Part 4: about 2 in (5 cm), at least one third of the chest depth.
    // Band 45–55 mm = guideline value ± 5 mm (project default). Rate 100–120/min: AHA 2020.
    // Full recoil within 4 mm: project default.
    child: { depthMinMm: 45, depthMaxMm: 55, rateMin: 100, rateMax: 120, recoilMaxMm: 4 },
    // Adult: 50–60 mm from AHA 2020 (at least 2 in / 5 cm, not more than 2.4 in / 6 cm) and ERC 2021 (5–6 cm).
    // Rate 100–120/min: AHA 2020 and ERC 2021. Full recoil within 5 mm: project default.
    adult: { depthMinMm: 50, depthMaxMm: 60, rateMin: 100, rateMax: 120, recoilMaxMm: 5 },
  },
  // A gap over 2 s is an interruption, not a slow compression (project default: a 2 s interval is 30/min,
  // far below any target rate).
  pauseThresholdS: 2,
  // AHA 2020: do not interrupt compressions for more than 10 seconds.
  longPauseLimitS: 10,
  passRule: {
    // 70 % of compressions at target: project default. No guideline publishes a pass mark in percent of
    // compressions; this is network policy.
    minDepthOkPct: 70,
    minRateOkPct: 70,
    minRecoilOkPct: 70,
    // Chest compression fraction at least 60 %: AHA 2015 Part 5, kept in AHA 2020 (from memory).
    minHandsOnPct: 60,
    // AHA 2020: pauses under 10 s.
    maxLongestPauseS: 10,
  },
  // Project default: groups smaller than this are hidden from funders and instructors to protect learners.
  suppressionMinCount: 5,
  // Project default: a group shown to instructors and funders holds the attempts of at least this many other
  // instructors, so no figure describes one or two colleagues (common practice in small-cell rules: a
  // minimum number of contributors beside a minimum count).
  suppressionMinInstructors: 3,
  // Project defaults (network policy, not a guideline).
  // Manikin drift: judged after 5 shared classes and from 3 mm against peers (project defaults; 3 mm is well
  // inside a guideline depth band of 10 mm, so a sensor off by that much moves learners across its edges).
  equipment: { serviceEveryCompressions: 250_000, serviceEveryDays: 365, minMouthpieceCleansPerLearner: 1, driftMinClasses: 5, driftMinOffsetMm: 3 },
};

export function bandFor(policy: NetworkPolicy, patientType: PatientType): Band {
  return policy.bands[patientType];
}

export interface GuidelineSource {
  id: string;
  citation: string;
}

export const GUIDELINE_SOURCES: readonly GuidelineSource[] = [
  {
    id: "aha-2020-adult",
    citation:
      "Panchal AR, Bartos JA, Cabañas JG, et al. Part 3: Adult Basic and Advanced Life Support. 2020 American " +
      "Heart Association Guidelines for Cardiopulmonary Resuscitation and Emergency Cardiovascular Care. " +
      "Circulation. 2020;142(16 suppl 2):S366–S468.",
  },
  {
    id: "aha-2020-pediatric",
    citation:
      "Topjian AA, Raymond TT, Atkins D, et al. Part 4: Pediatric Basic and Advanced Life Support. 2020 American " +
      "Heart Association Guidelines for Cardiopulmonary Resuscitation and Emergency Cardiovascular Care. " +
      "Circulation. 2020;142(16 suppl 2):S469–S523.",
  },
  {
    id: "erc-2021-bls",
    citation:
      "Olasveengen TM, Semeraro F, Ristagno G, et al. European Resuscitation Council Guidelines 2021: Basic Life " + "Support. Resuscitation. 2021;161:98–114.",
  },
];

export const SAFETY_NOTE =
  "Quarterbeat is a training-quality tool, not a medical device. Learners follow current resuscitation " +
  "guidelines, their training organisation and local protocols.";
