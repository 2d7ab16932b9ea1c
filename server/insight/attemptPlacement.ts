// Where one attempt sits among the network's attempts of its patient type and quarter, read from the value
// distributions the summaries keep (never from the attempts themselves). An instructor sees the placement only
// when the group holds enough of other people's attempts, as on every other page.
import type { AttemptPlacement, AttemptRow, PlacedMetric } from "../../shared/schemas/insight";
import type { Db } from "../db/client";
import { networkScope, percentileRankOfCounts, totalTally, valueCounts, type SummaryMetric } from "../metrics/summaries";
import { hidesGroup, type Viewer } from "./viewer";

const summaryMetricOf: Record<PlacedMetric, SummaryMetric> = {
  score: "score",
  depthOkPct: "depth_ok_pct",
  rateOkPct: "rate_ok_pct",
  recoilOkPct: "recoil_ok_pct",
  handsOnPct: "hands_on_pct",
};

function valueOf(attempt: AttemptRow, metric: PlacedMetric): number {
  return metric === "score" ? attempt.score : attempt.metrics[metric];
}

export function attemptPlacement(db: Db, viewer: Viewer, attempt: AttemptRow): AttemptPlacement {
  const scope = { ...networkScope(attempt.quarter, attempt.quarter), profile: attempt.profile };
  const group = totalTally(db, scope).n;
  const own = viewer.ownInstructorId === null ? 0 : totalTally(db, { ...scope, instructorId: viewer.ownInstructorId }).n;
  const hidden = hidesGroup(viewer, group - own);
  const percentiles = Object.fromEntries(
    (Object.keys(summaryMetricOf) as PlacedMetric[]).map((metric) => [
      metric,
      hidden ? null : percentileRankOfCounts(valueCounts(db, summaryMetricOf[metric], scope), valueOf(attempt, metric)),
    ]),
  ) as AttemptPlacement["percentiles"];
  return { quarter: attempt.quarter, profile: attempt.profile, attempts: hidden ? null : group, hidden, percentiles };
}
