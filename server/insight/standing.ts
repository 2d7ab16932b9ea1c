// "My standing": an instructor's own medians and pass rate beside the network's, the anonymous spread of all
// instructors, the funnel with the instructor's own point, the error profile and the classes. Other
// instructors appear only as anonymous points and network aggregates, and only as far as the released grid
// allows (./release): the network figures when it shows the scope, each other instructor as a point when
// they hold at least the smallest group's attempts, and the points of others only when there are at least
// as many of them as a group needs instructors. Comparisons between instructors (the funnel and the
// percentile ranks) are adjusted for case mix unless the viewer asks for the crude view.
import { eq } from "drizzle-orm";
import { standingMetricKeys, type StandingAnswer } from "../../shared/schemas/insight";
import { attemptErrorNames, type AttemptError } from "../../shared/scoring/scoreAttempt";
import { feedbackModes } from "../../shared/domain";
import type { AdjustMode } from "../../shared/filters";
import { patientTypes } from "../../shared/scoring/policy";
import { percentileRank } from "../../shared/stats";
import type { Db } from "../db/client";
import { instructors } from "../db/schema";
import { instructorFunnel, type InstructorFunnel } from "../metrics/instructorFunnel";
import { ceilingFigures, medianAtCeiling, METRIC_CEILING } from "../metrics/ceiling";
import { quantileOfPairs, shareAtLeast, type Pairs } from "../metrics/packedValues";
import {
  addTally,
  emptyTally,
  medianOfCounts,
  talliesByInstructorStratum,
  totalsByInstructor,
  valueCounts,
  distributionsByInstructor,
  countsOf,
  type StratumKey,
  type Tally,
  type ValueCounts,
} from "../metrics/summaries";
import { forbidden } from "../errors";
import { cached } from "./cache";
import { filtersKey, type ResolvedFilters } from "./filters";
import { funnelBlock, funnelComparison } from "./funnel";
import { classRows } from "./classes";
import { rateOf } from "./rates";
import { classConditions, scopeOf } from "./sql";
import { mayShow } from "./release";
import type { Viewer } from "./viewer";
import { errorLabels } from "../../shared/vocabulary";

type MetricKey = (typeof standingMetricKeys)[number];

/** Each instructor's distribution of one metric (as pairs), from which medians and ceiling figures are read. */
type Distributions = Pick<ReadonlyMap<number, Pairs>, "get"> & Iterable<[number, Pairs]>;

/** The figures every instructor's standing shares for the same filters: computed once per database state. */
interface NetworkFigures {
  /** Attempts, passes and errors per instructor. */
  tallies: Map<number, Tally>;
  /** Per metric: each instructor's distribution. */
  byInstructor: Record<MetricKey, Distributions>;
  /** Per metric: the network's distribution. */
  network: Record<MetricKey, ValueCounts>;
  errors: Record<AttemptError, number>;
  funnel: InstructorFunnel;
  /** Case-mix strata (patient type × feedback display) with attempts: each instructor's attempts and distributions there. */
  strata: { attempts: Map<number, number>; byInstructor: Record<MetricKey, Distributions> }[];
}

function networkFigures(db: Db, network: ResolvedFilters, adjust: AdjustMode): NetworkFigures {
  return cached(db, `standing-network|${adjust}|${filtersKey(network)}`, () => {
    const scope = scopeOf(network);
    const byMetric = <T>(compute: (key: MetricKey) => T) => Object.fromEntries(standingMetricKeys.map((key) => [key, compute(key)])) as Record<MetricKey, T>;
    // one read of the tallies by instructor and stratum serves the totals, the case-mix strata and the funnel
    const byInstructorStratum = talliesByInstructorStratum(db, scope);
    const tallies = totalsByInstructor(byInstructorStratum);
    // one read of the packed distributions gives every instructor's distribution of every metric, in total and
    // in each stratum
    const { byInstructor, byStratum } = distributionsByInstructor(db, scope);
    const strata: NetworkFigures["strata"] = [];
    if (adjust === "case-mix") {
      for (const feedback of network.feedback === null ? feedbackModes : [network.feedback]) {
        for (const profile of network.profile === null ? patientTypes : [network.profile]) {
          const stratum: StratumKey = `${profile}|${feedback}`;
          const attempts = new Map<number, number>();
          for (const [id, strata] of byInstructorStratum) {
            const n = strata.get(stratum)?.n ?? 0;
            if (n > 0) attempts.set(id, n);
          }
          if (attempts.size === 0) continue;
          // a view on the instructors' strata, not a copy: ranks read it once per request
          const inStratum = (key: MetricKey): Distributions => ({
            get: (id) => byStratum[key].get(id)?.get(stratum),
            *[Symbol.iterator]() {
              for (const [id, strata] of byStratum[key]) {
                const pairs = strata.get(stratum);
                if (pairs) yield [id, pairs];
              }
            },
          });
          strata.push({ attempts, byInstructor: byMetric(inStratum) });
        }
      }
    }
    return {
      tallies,
      byInstructor,
      network: byMetric((key) => valueCounts(db, key, scope)),
      errors: [...tallies.values()].reduce(addTally, emptyTally()).errors,
      funnel: instructorFunnel(db, scope, adjust, byInstructorStratum),
      strata,
    };
  });
}

/**
 * What instructors are ranked by: the median, or where the network's median sits at 100 % the share of
 * attempts at 100 % (ranks on tied medians would mean nothing).
 */
type RankedFigure = (pairs: Pairs) => number | null;
const byMedian: RankedFigure = (pairs) => quantileOfPairs(pairs, 0.5);
const byShareAtCeiling: RankedFigure = (pairs) => shareAtLeast(pairs, METRIC_CEILING);

/** My percentile rank among the shown instructors' figures (each instructor's distribution read by `figure`). */
function rankAmong(distributions: Distributions, figure: RankedFigure, me: number, shownIds: ReadonlySet<number>): number | null {
  const mine = distributions.get(me);
  const myValue = mine ? figure(mine) : null;
  if (myValue === null) return null;
  const others: number[] = [];
  for (const [id, pairs] of distributions) {
    if (!shownIds.has(id)) continue;
    const value = figure(pairs);
    if (value !== null) others.push(value);
  }
  return percentileRank(others, myValue);
}

/**
 * My percentile rank within each case-mix stratum among the shown instructors with attempts there, averaged by
 * my attempts in each stratum: an instructor who teaches only infants is ranked against infant attempts.
 */
function adjustedRank(strata: NetworkFigures["strata"], key: MetricKey, figure: RankedFigure, me: number, shownIds: ReadonlySet<number>): number | null {
  let weight = 0;
  let sum = 0;
  for (const stratum of strata) {
    const n = stratum.attempts.get(me) ?? 0;
    const rank = n === 0 ? null : rankAmong(stratum.byInstructor[key], figure, me, shownIds);
    if (rank === null) continue;
    sum += n * rank;
    weight += n;
  }
  return weight === 0 ? null : sum / weight;
}

export function standing(db: Db, viewer: Viewer, filters: ResolvedFilters, adjust: AdjustMode = "case-mix"): StandingAnswer {
  const me = viewer.ownInstructorId;
  if (me === null) throw forbidden("Your account is not linked to an instructor.");
  const self = db.select({ code: instructors.code, name: instructors.name }).from(instructors).where(eq(instructors.id, me)).get();
  if (!self) throw forbidden("Your account is not linked to an instructor.");

  const mine = { ...filters, instructorId: me };
  const min = viewer.suppressionMinCount;
  const networkFilters = { ...filters, instructorId: null };
  const { tallies, byInstructor, network, errors: networkErrorCounts, funnel, strata } = networkFigures(db, networkFilters, adjust);
  const perInstructor = [...tallies].map(([instructorId, { n, passed }]) => ({ instructorId, n, passed }));
  const totals = perInstructor.reduce((sum, row) => ({ n: sum.n + row.n, passed: sum.passed + row.passed }), { n: 0, passed: 0 });
  const myTally = perInstructor.find((row) => row.instructorId === me) ?? { instructorId: me, n: 0, passed: 0 };
  const networkHidden = !mayShow(db, viewer, scopeOf(networkFilters));
  // others shown as points and ranked against: each one person with enough attempts to be shown, and only
  // when the network is shown and enough of them are there that no point stands for a known colleague
  const others = perInstructor.filter((row) => row.instructorId !== me && row.n >= min);
  const othersShown = !networkHidden && others.length >= viewer.suppressionMinInstructors ? others : [];
  const shown = [...othersShown, ...perInstructor.filter((row) => row.instructorId === me)];
  const shownIds = new Set(shown.map((row) => row.instructorId));

  const metrics = standingMetricKeys.map((key) => {
    const myCounts = countsOf(byInstructor[key].get(me) ?? new Float64Array(0));
    // where the network's median sits at 100 % the median says nothing: show and rank the share at 100 % instead
    const atCeiling = medianAtCeiling(network[key]);
    const figure = atCeiling ? byShareAtCeiling : byMedian;
    return {
      key,
      mine: medianOfCounts(myCounts),
      network: networkHidden ? null : medianOfCounts(network[key]),
      percentileRank:
        networkHidden || othersShown.length === 0
          ? null
          : adjust === "case-mix"
            ? adjustedRank(strata, key, figure, me, shownIds)
            : rankAmong(byInstructor[key], figure, me, shownIds),
      ceiling: atCeiling ? { mine: ceilingFigures(myCounts), network: networkHidden ? null : ceilingFigures(network[key]) } : null,
    };
  });

  const points = shown
    .map((row) => ({
      medianScore: quantileOfPairs(byInstructor.score.get(row.instructorId)!, 0.5)!,
      passRate: row.passed / row.n,
      isMe: row.instructorId === me,
    }))
    .sort((a, b) => a.medianScore - b.medianScore || a.passRate - b.passRate);

  const myErrors = tallies.get(me)?.errors ?? emptyTally().errors;
  const networkErrors = networkHidden ? null : networkErrorCounts;

  return {
    period: filters.period,
    me: { instructorId: me, code: self.code, name: self.name },
    suppressionMinCount: min,
    attempts: myTally.n,
    metrics,
    spread: { minAttempts: min, points, instructorsLeftOut: perInstructor.length - shown.length },
    funnel: {
      // the curve's extent from the points shown only: the largest hidden group's size is not given away
      ...funnelBlock(funnel, networkHidden, shownIds),
      me: { ...rateOf(myTally.passed, myTally.n), ...funnelComparison(funnel.units.get(me), networkHidden) },
    },
    errorProfile: {
      networkSuppressed: networkHidden,
      rows: attemptErrorNames.map((error) => ({
        error,
        label: errorLabels[error],
        mine: myTally.n === 0 ? null : myErrors[error] / myTally.n,
        network: networkErrors === null || totals.n === 0 ? null : networkErrors[error] / totals.n,
      })),
    },
    classes: classRows(db, classConditions(mine)),
  };
}
