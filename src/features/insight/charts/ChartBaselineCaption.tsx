// Says where the control chart's centre line and limits come from (the baseline quarters) and how wide the
// limits are, and offers Laney's p′ limits for quarters with many attempts; the choice is kept in the URL
// (?limits=laney) so a link shows the same chart.
import { useSearchParam } from "../../../lib/useSearchParam";
import { quarterLabel } from "../../../../shared/period";
import { formatCount, formatFixed } from "../format";
import { splitSentence, type PassRateSeries } from "./PassRateControlChart";

/** Quarters this large make plain binomial limits narrow enough to flag ordinary variation (common practice). */
export const LANEY_SUGGESTED_ATTEMPTS = 200;

export function baselineSentence(series: PassRateSeries): string {
  const { baseline } = series;
  if (baseline.from === null || baseline.to === null) return "No quarter has attempts yet, so there is no baseline.";
  const range = baseline.from === baseline.to ? quarterLabel(baseline.from) : `${quarterLabel(baseline.from)} to ${quarterLabel(baseline.to)}`;
  const chosen =
    baseline.source === "setting"
      ? "the baseline a coordinator chose in Settings"
      : "the first four quarters with attempts (a coordinator can choose others in Settings)";
  const size = baseline.attempts === null ? "" : `, ${formatCount(baseline.attempts)} attempts`;
  const limits =
    series.limits === "laney" && series.sigmaZ !== null
      ? `Limits are 3 standard errors widened by Laney's factor σ_z = ${formatFixed(series.sigmaZ, 2)}, the quarter-to-quarter spread seen in the baseline.`
      : series.limits === "laney"
        ? "Laney's factor needs two baseline quarters with attempts; the limits are plain 3 standard errors."
        : "Limits are 3 standard errors of each quarter's number of attempts.";
  const cut = series.split === null ? "" : ` before the split`;
  return `Centre line${cut} from ${range} (${chosen}${size}): later quarters are judged against it and never move it. ${limits}`;
}

export function ChartBaselineCaption({ series }: { series: PassRateSeries }) {
  const [, setLimits] = useSearchParam("limits");
  const laney = series.limits === "laney";
  const largest = Math.max(0, ...series.points.map((p) => p.attempts ?? 0));
  const toggle = (on: boolean) => setLimits(on ? "laney" : null);
  return (
    <div className="flex max-w-3xl flex-col gap-2 text-small text-muted">
      <p>{baselineSentence(series)}</p>
      {series.split !== null && <p>{splitSentence(series)}</p>}
      {(laney || largest >= LANEY_SUGGESTED_ATTEMPTS) && (
        <label className="inline-flex items-center gap-2 text-ink">
          <input type="checkbox" checked={laney} onChange={(event) => toggle(event.target.checked)} />
          Widen the limits for large quarters (Laney's p′ chart)
        </label>
      )}
      {(laney || largest >= LANEY_SUGGESTED_ATTEMPTS) && (
        <p>
          With hundreds of attempts a quarter, plain limits are so narrow that ordinary differences between quarters fall outside them; Laney's p′ chart widens
          them by how much quarters really varied in the baseline.
        </p>
      )}
    </div>
  );
}
