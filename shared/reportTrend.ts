// Where the funder report's control chart takes its centre line from, in the words the PDF and the report
// page both use.
import { quarterLabel } from "./period";
import type { ReportData } from "./schemas/report";

/** Empty for versions stored before the baseline was recorded: they cannot say. */
export function trendBaselineText(trend: ReportData["trend"]): string {
  if (trend.baseline === undefined) return "";
  if (trend.baseline === null || trend.centre === null) {
    return "No quarter up to the end of this period can serve as a baseline, so no centre line or limits are drawn.";
  }
  const { from, to } = trend.baseline;
  const range = from === to ? quarterLabel(from) : `${quarterLabel(from)} to ${quarterLabel(to)}`;
  return `The centre line is the pass rate of the baseline quarters, ${range}; the quarters judged against it never move it.`;
}
