// Where the attempt sits among the network's attempts of its patient type and quarter, and the composite
// score in its modest place: a summary that leaves out hands-on time and pauses, so it never decides the result.
import type { AttemptPlacement } from "../../../shared/schemas/insight";
import { quarterLabel } from "../../../shared/period";
import { patientTypeNames } from "../../../shared/vocabulary";
import { formatCount } from "../../lib/formatting";
import { ordinal } from "./labels";

export interface NetworkPlacementProps {
  placement: AttemptPlacement;
  score: number;
}

/** A 0–100 track with the attempt's position on it; the words beside it carry the same number. */
function PercentileTrack({ percentile }: { percentile: number }) {
  return (
    <div className="relative h-3 w-full rounded-full bg-dusk-100" aria-hidden="true">
      {[25, 50, 75].map((q) => (
        <span key={q} className="absolute inset-y-0 w-px bg-dusk-300" style={{ left: `${q}%` }} />
      ))}
      <span className="absolute -top-1 size-5 -translate-x-1/2 rounded-full border-2 border-white bg-dusk-700 shadow" style={{ left: `${percentile}%` }} />
    </div>
  );
}

export function NetworkPlacement({ placement, score }: NetworkPlacementProps) {
  const group = `${patientTypeNames[placement.profile].toLowerCase()} attempts in ${quarterLabel(placement.quarter)}`;
  const p = placement.percentiles.score;
  return (
    <div className="flex flex-col gap-3">
      {placement.hidden || p === null || placement.attempts === null ? (
        <p className="text-small">
          The network’s {group} are not shown: too few of them are other instructors’, and a position among so few would reveal theirs.
        </p>
      ) : (
        <>
          <p>
            Its score is at the <strong className="tabular-nums">{ordinal(Math.round(p))} percentile</strong> of the network’s {formatCount(placement.attempts)}{" "}
            {group}: higher than {p.toFixed(1)} % of them, ties counted half.
          </p>
          <PercentileTrack percentile={p} />
          <p className="flex justify-between text-caption text-muted" aria-hidden="true">
            <span>lowest</span>
            <span>median</span>
            <span>highest</span>
          </p>
        </>
      )}
      <div className="rounded-control border border-line bg-paper px-3 py-2 text-small">
        <p>
          Composite score <strong className="tabular-nums">{Math.round(score)}</strong> of 100
        </p>
        <p className="text-muted">
          The mean of the depth, rate and recoil shares on target. It ignores hands-on time and pauses, so it does not decide the result; the pass rule does.
        </p>
      </div>
    </div>
  );
}
