// The choice between comparing instructors as measured and adjusted for case mix, kept in the URL
// (?adjust=none; adjusted when absent) so a link shows the same comparison. Pages that compare instructors
// show it beside the comparison and say what each view means.
import { useSearchParam } from "../../lib/useSearchParam";
import { adjustModes, type AdjustMode } from "../../../shared/filters";
import { adjustNames } from "../../../shared/vocabulary";
import { formatFixed } from "./format";
import { adjustModeFrom } from "./pageRequests";

export const adjustExplanations: Record<AdjustMode, string> = {
  "case-mix":
    "Each instructor is compared with what the network achieves on the same mix of patient types and feedback displays: an instructor who teaches mostly infants, whose attempts pass less often everywhere, is not marked down for it.",
  none: "Each instructor's pass rate is compared with the network's overall rate, whatever mix of patient types and feedback displays they teach.",
};

/** The comparison asked for in the URL; case mix unless `adjust=none`. */
export function useAdjustMode(): AdjustMode {
  const [adjust] = useSearchParam("adjust");
  return adjustModeFrom(adjust);
}

export function AdjustChoice() {
  const [, setAdjust] = useSearchParam("adjust");
  const mode = useAdjustMode();
  const choose = (next: AdjustMode) => setAdjust(next === "case-mix" ? null : next);
  return (
    <fieldset className="flex flex-col gap-2 rounded-card border border-line bg-surface p-4">
      <legend className="px-1 text-small font-semibold">Compare instructors</legend>
      <div className="flex flex-wrap gap-x-6 gap-y-2">
        {adjustModes.map((option) => (
          <label key={option} className="inline-flex items-center gap-2">
            <input type="radio" name="adjust" value={option} checked={mode === option} onChange={() => choose(option)} />
            {adjustNames[option]}
            {option === "case-mix" && <span className="text-small text-muted">(default)</span>}
          </label>
        ))}
      </div>
      <p className="text-small text-muted">{adjustExplanations[mode]}</p>
    </fieldset>
  );
}

/** What the funnel's limits rest on: the dispersion φ and whether the limits were widened by √φ. */
export function dispersionSentence(funnel: { phi: number | null; overdispersed: boolean; scale: number }): string {
  if (funnel.phi === null) return "Too few instructors to estimate how much they vary: the limits are those of chance alone.";
  const phi = formatFixed(funnel.phi, 2);
  return funnel.overdispersed
    ? `Instructors vary more than chance alone allows (dispersion φ = ${phi}), so the limits are widened by √φ = ${formatFixed(funnel.scale, 2)}: only differences beyond that spread are flagged.`
    : `Instructors vary no more than chance allows (dispersion φ = ${phi}), so the limits are those of chance alone, not widened.`;
}
