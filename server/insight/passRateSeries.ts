// The overview's quarterly p-chart of the measured pass rate: centre and limits from stated baseline quarters
// (never from the quarters being judged), optionally split at a date into two phases — before and after an
// improvement action — each with its own centre and limits, and the run-chart rules over the shown quarters.
//
// Phases follow the same rule as the first baseline: a phase's centre comes from its first four quarters with
// attempts (DEFAULT_BASELINE_QUARTERS). Until the phase after a split has four, its quarters are judged against
// the limits before it, which is the question a quality lead asks of a fresh change: "is this beyond what the
// old process gives by chance?". A quarter a viewer could not be shown on its own never enters a centre line.
import { firstQuarterFrom, previousQuarter } from "../../shared/period";
import type { chartLimitModes } from "../../shared/schemas/chartSettings";
import { DEFAULT_BASELINE_QUARTERS, type ChartBaseline } from "../../shared/schemas/chartSettings";
import type { OverviewAnswer } from "../../shared/schemas/insight";
import { median, pChart, runChartSignals, type PChartSample } from "../../shared/stats";
import type { Db } from "../db/client";
import { talliesBy } from "../metrics/summaries";
import { chartBaseline } from "./chartBaseline";
import type { ResolvedFilters } from "./filters";
import { quartersWithData } from "./quarters";
import { rateOf } from "./rates";
import { mayShow } from "./release";
import { scopeOf } from "./sql";
import type { Viewer } from "./viewer";

type Series = OverviewAnswer["series"];
type LimitMode = (typeof chartLimitModes)[number];

export interface SeriesInput {
  /** The trend's quarters, oldest first. */
  quarters: readonly string[];
  /** Attempts and passes per trend quarter. */
  byQuarter: ReadonlyMap<string, { n: number; passed: number }>;
  /** Per trend quarter: hidden from this viewer. */
  hidden: readonly boolean[];
  limits: LimitMode;
  /** Split the chart at this date ("YYYY-MM-DD"), or null for one phase. */
  splitAt: string | null;
}

interface PhaseBaseline {
  from: string;
  to: string;
  samples: PChartSample[];
}

/** The baseline quarters' tallies in this chart's scope, leaving out any quarter this viewer may not see alone. */
function baselineSamples(db: Db, viewer: Viewer, filters: ResolvedFilters, from: string, to: string): PChartSample[] {
  const byQuarter = talliesBy<string>(db, scopeOf(filters, { from, to }), "quarter");
  return [...byQuarter.keys()]
    .sort()
    .filter((quarter) => mayShow(db, viewer, scopeOf(filters, { from: quarter, to: quarter })))
    .map((quarter) => ({ n: byQuarter.get(quarter)!.n, count: byQuarter.get(quarter)!.passed }));
}

/** The first four quarters with attempts from `from` on, or null when there are not yet four. */
function phaseBaseline(db: Db, viewer: Viewer, filters: ResolvedFilters, from: string): PhaseBaseline | null {
  const quarters = [...quartersWithData(db)].reverse().filter((quarter) => quarter >= from);
  if (quarters.length < DEFAULT_BASELINE_QUARTERS) return null;
  const to = quarters[DEFAULT_BASELINE_QUARTERS - 1];
  return { from, to, samples: baselineSamples(db, viewer, filters, from, to) };
}

/** Before a split, the stated baseline cut at the split; when nothing of it lies before, the first quarters that do. */
function baselineBefore(
  db: Db,
  viewer: Viewer,
  filters: ResolvedFilters,
  stated: ChartBaseline,
  splitQuarter: string | null,
): { from: string | null; to: string | null; samples: PChartSample[] } {
  if (stated.from === null || stated.to === null) return { from: null, to: null, samples: [] };
  if (splitQuarter === null || stated.to < splitQuarter)
    return { from: stated.from, to: stated.to, samples: baselineSamples(db, viewer, filters, stated.from, stated.to) };
  const lastBefore = previousQuarter(splitQuarter);
  if (stated.from <= lastBefore) return { from: stated.from, to: lastBefore, samples: baselineSamples(db, viewer, filters, stated.from, lastBefore) };
  const before = [...quartersWithData(db)].reverse().filter((quarter) => quarter < splitQuarter);
  if (before.length === 0) return { from: null, to: null, samples: [] };
  const to = before[Math.min(DEFAULT_BASELINE_QUARTERS, before.length) - 1];
  return { from: before[0], to, samples: baselineSamples(db, viewer, filters, before[0], to) };
}

const sumN = (samples: readonly PChartSample[]) => samples.reduce((sum, sample) => sum + sample.n, 0);

export function passRateSeries(db: Db, viewer: Viewer, filters: ResolvedFilters, input: SeriesInput): Series {
  const { quarters, byQuarter, hidden, limits } = input;
  const splitQuarter = input.splitAt === null ? null : firstQuarterFrom(input.splitAt);
  const stated = chartBaseline(db);
  const before = baselineBefore(db, viewer, filters, stated, splitQuarter);
  const found = splitQuarter === null ? null : phaseBaseline(db, viewer, filters, splitQuarter);
  // a phase whose baseline quarters are all hidden from this viewer has no centre of its own to show
  const after = found !== null && found.samples.length > 0 ? found : null;
  const laney = limits === "laney";

  const samples = quarters.map((quarter, i): PChartSample =>
    hidden[i] ? { n: 0, count: 0 } : { n: byQuarter.get(quarter)!.n, count: byQuarter.get(quarter)!.passed },
  );
  const isAfter = (quarter: string) => splitQuarter !== null && quarter >= splitQuarter;
  const beforeChart = pChart(samples, { baseline: before.samples, laney });
  const afterChart = after === null ? null : pChart(samples, { baseline: after.samples, laney });
  const chartPoints = quarters.map((quarter, i) => (afterChart !== null && isAfter(quarter) ? afterChart.points[i] : beforeChart.points[i]));

  // the run-chart median: of the shown quarters, or with a split of those before it, carried on after it
  const shownRates = chartPoints.flatMap((point, i) => (hidden[i] || point.p === null ? [] : [point.p]));
  const ratesBefore = chartPoints.flatMap((point, i) => (hidden[i] || point.p === null || isAfter(quarters[i]) ? [] : [point.p]));
  const runMedian = splitQuarter !== null && ratesBefore.length >= 2 ? median(ratesBefore) : median(shownRates);

  return {
    centre: beforeChart.centre,
    baseline: { from: before.from, to: before.to, source: stated.source, attempts: before.samples.length === 0 ? null : sumN(before.samples) },
    limits,
    sigmaZ: beforeChart.sigmaZ,
    split:
      splitQuarter === null || input.splitAt === null
        ? null
        : {
            date: input.splitAt,
            quarter: splitQuarter,
            centre: afterChart?.centre ?? null,
            baseline: after === null ? null : { from: after.from, to: after.to, attempts: sumN(after.samples) },
            sigmaZ: afterChart?.sigmaZ ?? null,
          },
    runChart: runChartSignals(shownRates, runMedian),
    points: quarters.map((quarter, i) => {
      if (hidden[i])
        return { quarter, attempts: null, passed: null, rate: null, low: null, high: null, lcl: null, ucl: null, outside: false, suppressed: true };
      const point = chartPoints[i];
      const rate = rateOf(point.count, point.n);
      return {
        quarter,
        attempts: point.n,
        passed: point.count,
        rate: point.p,
        low: rate.low,
        high: rate.high,
        lcl: point.lcl,
        ucl: point.ucl,
        outside: point.outside,
        suppressed: false,
      };
    }),
  };
}
