// My medians beside the network's, with my percentile among instructors, one card per measure.
import type { StandingAnswer } from "../../../../shared/schemas/insight";
import { formatFixed, formatPct, formatScore } from "../format";
import { Suppressed } from "../Suppressed";

type Metric = StandingAnswer["metrics"][number];

export const metricWords: Record<Metric["key"], { label: string; hint: string }> = {
  score: { label: "Score", hint: "Median attempt score, out of 100" },
  depth_ok_pct: { label: "Depth", hint: "Median share of compressions at the target depth" },
  rate_ok_pct: { label: "Rate", hint: "Median share of compressions at the target rate" },
  recoil_ok_pct: { label: "Release (recoil)", hint: "Median share of compressions with the chest fully released" },
  hands_on_pct: { label: "Hands-on time", hint: "Median share of the attempt spent compressing" },
};

export function formatMetric(key: Metric["key"], value: number | null): string {
  return key === "score" ? formatScore(value) : formatPct(value);
}

export function ordinal(n: number): string {
  const rest100 = n % 100;
  if (rest100 >= 11 && rest100 <= 13) return `${n}th`;
  return `${n}${({ 1: "st", 2: "nd", 3: "rd" } as Record<number, string>)[n % 10] ?? "th"}`;
}

/**
 * Closer than this to the network's median (in points of a share, or of the score) reads as no real
 * difference whatever the rank: instructors' medians often lie within a few points of each other, so a low
 * rank alone would call a gap of one point "among the lowest". A product choice, stated on the page.
 */
export const CLOSE_TO_NETWORK_POINTS = 3;

/** Words for my standing that follow the size of my difference from the network first and my rank second. */
export function percentileSentence(rank: number | null, instructors: number, difference: number | null, adjusted = false): string {
  if (rank === null || instructors < 2) return "No rank: no other instructor has enough attempts to compare with.";
  const rounded = Math.round(rank);
  const among = adjusted ? `${instructors} instructors, on the same patient types and displays` : `${instructors} instructors`;
  if (difference !== null && Math.abs(difference) < CLOSE_TO_NETWORK_POINTS) {
    return `${ordinal(rounded)} percentile of ${among}, but within ${CLOSE_TO_NETWORK_POINTS} points of the network's median: about the same as the network.`;
  }
  const where =
    rounded >= 75
      ? "among the highest"
      : rounded > 55
        ? "above the middle"
        : rounded >= 45
          ? "near the middle"
          : rounded > 25
            ? "below the middle"
            : "among the lowest";
  return `${ordinal(rounded)} percentile of ${among}: ${where}.`;
}

/** Where most attempts reach 100 %: the share at 100 % and the 10th percentile say more than a median of 100. */
function CeilingFigures({ metric, answer }: { metric: Metric; answer: StandingAnswer }) {
  const ceiling = metric.ceiling!;
  const hidden = <Suppressed minCount={answer.suppressionMinCount} />;
  return (
    <>
      <p className="mt-1 flex items-baseline gap-2">
        <span className="text-headline whitespace-nowrap tabular-nums">
          {formatPct(ceiling.mine.shareAtCeiling === null ? null : ceiling.mine.shareAtCeiling * 100)}
        </span>
        <span className="text-small text-muted">of your attempts at 100 %</span>
      </p>
      <p className="text-small tabular-nums">
        Network:{" "}
        {ceiling.network === null ? (
          hidden
        ) : (
          <strong>{formatPct(ceiling.network.shareAtCeiling === null ? null : ceiling.network.shareAtCeiling * 100)}</strong>
        )}
      </p>
      <p className="text-small tabular-nums">
        Weakest tenth below: you {formatPct(ceiling.mine.p10)}, network {ceiling.network === null ? hidden : formatPct(ceiling.network.p10)}
      </p>
      <p className="text-caption text-muted">Most attempts reach 100 % here, so the median (100 %) would tell instructors apart by nothing.</p>
    </>
  );
}

export function StandingMetrics({ answer }: { answer: StandingAnswer }) {
  const instructors = answer.spread.points.length;
  const networkHidden = answer.errorProfile.networkSuppressed;
  return (
    <ul className="grid grid-cols-1 gap-4 sm:grid-cols-2 xl:grid-cols-5" aria-label="Your medians beside the network's">
      {answer.metrics.map((metric) => {
        const words = metricWords[metric.key];
        const mine = metric.mine;
        const diff = mine !== null && metric.network !== null ? mine - metric.network : null;
        return (
          <li key={metric.key} className="flex flex-col gap-1 rounded-card border border-line bg-surface p-4 shadow-card">
            <h3 className="text-small font-semibold text-muted">{words.label}</h3>
            <p className="text-caption text-muted">{words.hint}</p>
            {metric.ceiling ? (
              <CeilingFigures metric={metric} answer={answer} />
            ) : (
              <>
                <p className="mt-1 flex items-baseline gap-2">
                  <span className="text-headline whitespace-nowrap tabular-nums">{formatMetric(metric.key, mine)}</span>
                  <span className="text-small text-muted">you</span>
                </p>
                <p className="text-small tabular-nums">
                  Network: {networkHidden ? <Suppressed minCount={answer.suppressionMinCount} /> : <strong>{formatMetric(metric.key, metric.network)}</strong>}
                  {diff !== null && Math.abs(diff) >= 0.05 && (
                    <span className="text-muted">
                      {" "}
                      ({diff > 0 ? "you +" : "you −"}
                      {metric.key === "score" ? formatFixed(Math.abs(diff), 1) : `${formatFixed(Math.abs(diff), 1)} points`})
                    </span>
                  )}
                </p>
              </>
            )}
            <p className="mt-auto pt-1 text-caption text-ink">
              {networkHidden
                ? "No rank while the network is hidden."
                : percentileSentence(metric.percentileRank, instructors, metric.ceiling ? null : diff, answer.funnel.adjust === "case-mix")}
              {metric.ceiling && !networkHidden && metric.percentileRank !== null ? " (ranked by the share at 100 %)" : ""}
            </p>
          </li>
        );
      })}
    </ul>
  );
}
