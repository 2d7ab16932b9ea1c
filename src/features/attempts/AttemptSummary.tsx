// The numbers of one attempt beside their targets and the pass rule of the policy version that scored it.
import type { AttemptDetailAnswer } from "../../../shared/schemas/insight";
import type { Band, NetworkPolicy } from "../../../shared/scoring/policy";
import { formatLength, type LengthUnit } from "../../../shared/units";
import { StatCard } from "../../components/StatCard";
import type { TargetStatus } from "../../components/TargetBadge";
import { atMost, beside, percentBeside, percentOf100 } from "./labels";

export interface AttemptSummaryProps {
  attempt: AttemptDetailAnswer["attempt"];
  band: Band | null;
  policy: NetworkPolicy | null;
  unit: LengthUnit;
}

function atLeast(value: number, min: number | undefined): TargetStatus | undefined {
  return min === undefined ? undefined : value >= min ? "on_target" : "too_low";
}

/** Says which way a share of compressions missed its pass mark, from the two ways it can miss. */
function missedBy(status: TargetStatus | undefined, low: { share: number; words: string }, high: { share: number; words: string }): string | undefined {
  if (status !== "too_low") return undefined;
  return `Below the pass mark: mostly ${low.share >= high.share ? low.words : high.words}`;
}

export function AttemptSummary({ attempt, band, policy, unit }: AttemptSummaryProps) {
  const m = attempt.metrics;
  const rule = policy?.passRule;
  const len = (mm: number) => formatLength(mm, unit);
  const depthStatus: TargetStatus | undefined = band ? (m.depthMm < band.depthMinMm ? "too_low" : m.depthMm > band.depthMaxMm ? "too_high" : "on_target") : undefined;
  const rateStatus: TargetStatus | undefined = band ? (m.rateCpm < band.rateMin ? "too_low" : m.rateCpm > band.rateMax ? "too_high" : "on_target") : undefined;
  const passNeeds = (min: number | undefined, what = "at least") => (min === undefined ? null : `Pass needs ${what} ${min} %`);
  const noRate = m.compressions < 2 || (m.rateCpm === 0 && m.rateOkPct === 0);
  return (
    <div className="grid grid-cols-[repeat(auto-fill,minmax(9.5rem,1fr))] gap-3">
      <StatCard
        label="Mean depth"
        value={len(m.depthMm).replace(` ${unit}`, "")}
        unit={unit}
        status={depthStatus}
        footnote={band ? `Target ${len(band.depthMinMm)} to ${len(band.depthMaxMm)}` : "Target band not available"}
      />
      <StatCard
        label="Depth on target"
        value={percentBeside(m.depthOkPct, rule?.minDepthOkPct)}
        status={atLeast(m.depthOkPct, rule?.minDepthOkPct)}
        statusLabel={missedBy(atLeast(m.depthOkPct, rule?.minDepthOkPct), { share: m.tooShallowPct, words: "too shallow" }, { share: m.tooDeepPct, words: "too deep" })}
        footnote={[`${percentOf100(m.tooShallowPct)} too shallow, ${percentOf100(m.tooDeepPct)} too deep`, passNeeds(rule?.minDepthOkPct)].filter(Boolean).join(". ")}
      />
      <StatCard
        label="Mean rate"
        value={noRate ? "–" : Math.round(m.rateCpm)}
        unit={noRate ? undefined : "/min"}
        status={noRate ? undefined : rateStatus}
        footnote={band ? `Target ${band.rateMin}–${band.rateMax} per minute. The pass rule judges the share of compressions in the band, not the mean` : undefined}
      />
      <StatCard
        label="Rate on target"
        value={percentBeside(m.rateOkPct, rule?.minRateOkPct)}
        status={atLeast(m.rateOkPct, rule?.minRateOkPct)}
        statusLabel={missedBy(atLeast(m.rateOkPct, rule?.minRateOkPct), { share: m.tooSlowPct, words: "too slow" }, { share: m.tooFastPct, words: "too fast" })}
        footnote={[`${percentOf100(m.tooSlowPct)} too slow, ${percentOf100(m.tooFastPct)} too fast`, passNeeds(rule?.minRateOkPct)].filter(Boolean).join(". ")}
      />
      <StatCard
        label="Full recoil"
        value={percentBeside(m.recoilOkPct, rule?.minRecoilOkPct)}
        status={atLeast(m.recoilOkPct, rule?.minRecoilOkPct)}
        footnote={[band ? `Full when at most ${len(band.recoilMaxMm)} still pressed` : null, passNeeds(rule?.minRecoilOkPct)].filter(Boolean).join(". ")}
      />
      <StatCard
        label="Hands-on time"
        value={percentBeside(m.handsOnPct, rule?.minHandsOnPct)}
        status={atLeast(m.handsOnPct, rule?.minHandsOnPct)}
        footnote={passNeeds(rule?.minHandsOnPct) ?? "Share of the attempt spent compressing"}
      />
      <StatCard
        label="Longest pause"
        value={rule ? beside(m.longestPauseS, rule.maxLongestPauseS, atMost, 1) : m.longestPauseS.toFixed(1)}
        unit="s"
        status={rule ? (m.longestPauseS <= rule.maxLongestPauseS ? "on_target" : "too_high") : undefined}
        footnote={[m.pauses === null ? null : `${m.pauses} pause${m.pauses === 1 ? "" : "s"} in all`, rule ? `Pass needs at most ${rule.maxLongestPauseS} s` : null].filter(Boolean).join(". ")}
      />
      <StatCard label="Compressions" value={m.compressions} footnote={`Over ${m.durationS.toFixed(1)} s`} />
    </div>
  );
}
