// The network's pass rule as a checklist: each criterion with the attempt's value as recorded (written so it
// never lands on the threshold it missed), the pass mark, the margin, which way a missed share went, and where
// the value sits among the network's attempts of the same patient type and quarter.
import clsx from "clsx";
import type { AttemptPlacement, AttemptRow, PlacedMetric } from "../../../shared/schemas/insight";
import { passRuleCriteria, type CriterionKey, type PassCriterion } from "../../../shared/scoring/passRuleCriteria";
import type { Band, PassRule } from "../../../shared/scoring/policy";
import { formatLength, type LengthUnit } from "../../../shared/units";
import { errorShortNames } from "../../../shared/vocabulary";
import { besideThreshold, marginWords, ordinal } from "./labels";

const criterionNames: Record<CriterionKey, string> = {
  depth: "Depth on target",
  rate: "Rate on target",
  recoil: "Full recoil",
  handsOn: "Hands-on time",
  longestPause: "Longest pause",
};

const placedMetricOf: Partial<Record<CriterionKey, PlacedMetric>> = {
  depth: "depthOkPct",
  rate: "rateOkPct",
  recoil: "recoilOkPct",
  handsOn: "handsOnPct",
};

/** The ways a share can miss, in the words of the split shown under it. */
const splitWords: Partial<Record<CriterionKey, [string, string]>> = {
  depth: ["too shallow", "too deep"],
  rate: ["too slow", "too fast"],
};

function whatItCounts(key: CriterionKey, band: Band | null, unit: LengthUnit): string {
  switch (key) {
    case "depth":
      return band
        ? `Share of compressions ${formatLength(band.depthMinMm, unit)} to ${formatLength(band.depthMaxMm, unit)} deep`
        : "Share of compressions in the depth band";
    case "rate":
      return band ? `Share of compressions at ${band.rateMin}–${band.rateMax} per minute` : "Share of compressions in the rate band";
    case "recoil":
      return band ? `Share of compressions released to within ${formatLength(band.recoilMaxMm, unit)}` : "Share of compressions with the chest fully released";
    case "handsOn":
      return "Share of the attempt spent compressing";
    case "longestPause":
      return "Longest gap between compressions";
  }
}

/** A criterion's value, threshold and margin in its unit, with the decimals that decide. */
function written(c: PassCriterion) {
  const seconds = c.key === "longestPause";
  const decimals = seconds ? 1 : 0;
  const unit = seconds ? " s" : " %";
  return {
    value: `${besideThreshold(c.value, c.threshold, decimals)}${unit}`,
    threshold: `${c.comparison === "atLeast" ? "at least" : "at most"} ${c.threshold}${unit}`,
    margin: marginWords(c.value, c.threshold, c.comparison, seconds ? "s" : "points", decimals),
  };
}

function CriterionMark({ met }: { met: boolean }) {
  return (
    <svg viewBox="0 0 20 20" className={clsx("size-5 shrink-0", met ? "text-on-target-mark" : "text-too-high-mark")} aria-hidden="true">
      {met ? (
        <>
          <circle cx="10" cy="10" r="9" fill="currentColor" />
          <path d="M5.5 10.5l3 3 6-7" fill="none" stroke="white" strokeWidth="2.2" strokeLinecap="round" strokeLinejoin="round" />
        </>
      ) : (
        <>
          <rect x="1" y="1" width="18" height="18" rx="3" fill="currentColor" />
          <path d="M6.5 6.5l7 7M13.5 6.5l-7 7" stroke="white" strokeWidth="2.2" strokeLinecap="round" />
        </>
      )}
    </svg>
  );
}

/** What a miss means, and for a share which way most of the missing compressions went. */
function missWords(c: PassCriterion): string | null {
  if (c.met || c.error === null) return null;
  const words = errorShortNames[c.error].toLowerCase();
  return c.split ? `mostly ${words}` : words;
}

function splitLine(c: PassCriterion): string | null {
  const words = splitWords[c.key];
  if (!c.split || !words) return null;
  return `${c.split.low.toFixed(1)} % ${words[0]}, ${c.split.high.toFixed(1)} % ${words[1]}`;
}

function percentileText(placement: AttemptPlacement, metric: PlacedMetric | undefined): string {
  if (!metric) return "–";
  const p = placement.percentiles[metric];
  return p === null ? "not shown" : `${ordinal(Math.round(p))} percentile`;
}

export interface PassRuleChecklistProps {
  attempt: AttemptRow;
  rule: PassRule;
  band: Band | null;
  placement: AttemptPlacement;
  unit: LengthUnit;
}

/** The pass rule's criteria for an attempt's recorded metrics. */
export function criteriaOf(attempt: AttemptRow, rule: PassRule): PassCriterion[] {
  const m = attempt.metrics;
  return passRuleCriteria(
    {
      compressions: m.compressions,
      depth_ok_pct: m.depthOkPct,
      too_shallow_pct: m.tooShallowPct,
      too_deep_pct: m.tooDeepPct,
      rate_ok_pct: m.rateOkPct,
      too_slow_pct: m.tooSlowPct,
      too_fast_pct: m.tooFastPct,
      recoil_ok_pct: m.recoilOkPct,
      hands_on_pct: m.handsOnPct,
      longest_pause_s: m.longestPauseS,
    },
    rule,
  );
}

export function PassRuleChecklist({ attempt, rule, band, placement, unit }: PassRuleChecklistProps) {
  const criteria = criteriaOf(attempt, rule);
  return (
    <ol className="flex flex-col divide-y divide-line" aria-label="Criteria of the pass rule">
      {criteria.map((c) => {
        const text = written(c);
        const miss = missWords(c);
        const split = splitLine(c);
        return (
          <li
            key={c.key}
            data-criterion={c.key}
            className="grid grid-cols-2 gap-x-4 gap-y-2 py-3 first:pt-0 last:pb-0 sm:grid-cols-4 lg:grid-cols-[minmax(0,2.2fr)_repeat(4,minmax(0,1fr))] lg:items-center"
          >
            <div className="col-span-2 flex items-start gap-2.5 sm:col-span-4 lg:col-span-1">
              <CriterionMark met={c.met} />
              <div className="min-w-0">
                <div className="flex flex-wrap items-baseline gap-x-2">
                  <h3 className="font-semibold text-ink">{criterionNames[c.key]}</h3>
                  <p className={clsx("text-small font-semibold", c.met ? "text-on-target-text" : "text-too-high-text")} data-verdict>
                    {c.met ? "Met" : miss ? `Missed: ${miss}` : "Missed"}
                  </p>
                </div>
                <p className="text-caption text-muted">
                  {whatItCounts(c.key, band, unit)}
                  {split && <>. {split}</>}
                </p>
              </div>
            </div>
            <Figure label="This attempt" value={text.value} strong />
            <Figure label="Pass mark" value={text.threshold} />
            <Figure label="Margin" value={text.margin} tone={c.met ? "met" : "missed"} />
            <Figure label="In the network" value={percentileText(placement, placedMetricOf[c.key])} />
          </li>
        );
      })}
    </ol>
  );
}

function Figure({ label, value, strong = false, tone }: { label: string; value: string; strong?: boolean; tone?: "met" | "missed" }) {
  return (
    <dl className="min-w-0">
      <dt className="text-caption text-muted">{label}</dt>
      <dd
        className={clsx(
          "tabular-nums",
          strong ? "text-lead font-semibold text-ink" : "text-small font-medium",
          tone === "met" && "text-on-target-text",
          tone === "missed" && "text-too-high-text",
        )}
      >
        {value}
      </dd>
    </dl>
  );
}
