// Requests and answers of the policy settings routes (/api/settings/policy*, /api/settings/rescore), and where
// each default of the network policy comes from, for the settings page to show beside each field.
import { z } from "zod";
import { networkPolicySchema } from "../scoring/policy";
import { quarterParamSchema } from "../filters";

export const policyVersionSchema = z.object({
  version: z.number().int(),
  policy: networkPolicySchema,
  note: z.string(),
  createdAt: z.string(),
});

export const savePolicySchema = z.object({
  policy: networkPolicySchema,
  note: z.string().trim().max(500, "Use at most 500 characters").default(""),
});

export const rescoreSchema = z.object({ fromQuarter: quarterParamSchema.optional() });

export const rescoreAnswerSchema = z.object({
  version: z.number().int(),
  /** Attempts scored under an older version (from fromQuarter on) and scored again. */
  examined: z.number().int(),
  /** Of those, attempts whose score, result or errors changed; their old values went to the score history. */
  changed: z.number().int(),
});
export type RescoreAnswer = z.infer<typeof rescoreAnswerSchema>;

export const policySourceKinds = ["guideline", "guideline_with_project_tolerance", "project_default"] as const;

export const policyFieldSourceSchema = z.object({
  /** Dotted path into the policy; "*" stands for every patient type. */
  path: z.string(),
  kind: z.enum(policySourceKinds),
  /** Ids from GUIDELINE_SOURCES. */
  sources: z.array(z.string()),
  note: z.string(),
});
export type PolicyFieldSource = z.infer<typeof policyFieldSourceSchema>;

/** Where each default comes from (the reasons are written beside DEFAULT_POLICY in shared/scoring/policy.ts). */
export const POLICY_FIELD_SOURCES: readonly PolicyFieldSource[] = [
  { path: "bands.adult.depthMinMm", kind: "guideline", sources: ["aha-2020-adult", "erc-2021-bls"], note: "At least 5 cm." },
  { path: "bands.adult.depthMaxMm", kind: "guideline", sources: ["aha-2020-adult", "erc-2021-bls"], note: "Not more than 6 cm." },
  {
    path: "bands.child.depthMinMm",
    kind: "guideline_with_project_tolerance",
    sources: ["aha-2020-pediatric"],
    note: "About 5 cm (one third of the chest depth), band ± 5 mm.",
  },
  { path: "bands.child.depthMaxMm", kind: "guideline_with_project_tolerance", sources: ["aha-2020-pediatric"], note: "About 5 cm, band ± 5 mm." },
  {
    path: "bands.infant.depthMinMm",
    kind: "guideline_with_project_tolerance",
    sources: ["aha-2020-pediatric"],
    note: "About 4 cm (one third of the chest depth), band ± 5 mm.",
  },
  { path: "bands.infant.depthMaxMm", kind: "guideline_with_project_tolerance", sources: ["aha-2020-pediatric"], note: "About 4 cm, band ± 5 mm." },
  { path: "bands.*.rateMin", kind: "guideline", sources: ["aha-2020-adult", "aha-2020-pediatric", "erc-2021-bls"], note: "100 per minute, every age." },
  { path: "bands.*.rateMax", kind: "guideline", sources: ["aha-2020-adult", "aha-2020-pediatric", "erc-2021-bls"], note: "120 per minute, every age." },
  {
    path: "bands.*.recoilMaxMm",
    kind: "project_default",
    sources: [],
    note: "Guidelines ask for full recoil without a number; the tolerance is the project's.",
  },
  { path: "pauseThresholdS", kind: "project_default", sources: [], note: "A gap over 2 s is an interruption, not a slow compression." },
  { path: "longPauseLimitS", kind: "guideline", sources: ["aha-2020-adult"], note: "Do not interrupt compressions for more than 10 seconds." },
  { path: "passRule.minDepthOkPct", kind: "project_default", sources: [], note: "No guideline sets a pass mark in percent of compressions." },
  { path: "passRule.minRateOkPct", kind: "project_default", sources: [], note: "No guideline sets a pass mark in percent of compressions." },
  { path: "passRule.minRecoilOkPct", kind: "project_default", sources: [], note: "No guideline sets a pass mark in percent of compressions." },
  { path: "passRule.minHandsOnPct", kind: "guideline", sources: ["aha-2020-adult"], note: "Chest compression fraction of at least 60 %." },
  { path: "passRule.maxLongestPauseS", kind: "guideline", sources: ["aha-2020-adult"], note: "Pauses under 10 seconds." },
  { path: "suppressionMinCount", kind: "project_default", sources: [], note: "Smaller groups are hidden from funders and from instructors looking at others." },
  {
    path: "suppressionMinInstructors",
    kind: "project_default",
    sources: [],
    note: "Groups with the attempts of fewer other instructors are hidden from funders and from instructors looking at others.",
  },
  { path: "equipment.serviceEveryCompressions", kind: "project_default", sources: [], note: "Network policy, not a manufacturer's figure." },
  { path: "equipment.serviceEveryDays", kind: "project_default", sources: [], note: "Network policy, not a manufacturer's figure." },
  { path: "equipment.minMouthpieceCleansPerLearner", kind: "project_default", sources: [], note: "Network policy." },
  { path: "equipment.driftMinClasses", kind: "project_default", sources: [], note: "Fewer shared classes give too wide an interval to judge a device." },
  { path: "equipment.driftMinOffsetMm", kind: "project_default", sources: [], note: "A smaller difference stays well inside a depth band of 10 mm." },
];

export const policySettingsAnswerSchema = z.object({
  current: policyVersionSchema,
  defaults: networkPolicySchema,
  fieldSources: z.array(policyFieldSourceSchema),
  sources: z.array(z.object({ id: z.string(), citation: z.string() })),
  safetyNote: z.string(),
});
export type PolicySettingsAnswer = z.infer<typeof policySettingsAnswerSchema>;

export const policyVersionsAnswerSchema = z.object({ versions: z.array(policyVersionSchema) });
