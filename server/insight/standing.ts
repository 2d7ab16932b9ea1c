// "My standing": an instructor's own medians and pass rate beside the network's, the anonymous spread of all
// instructors, the funnel with the instructor's own point, the error profile and the classes. Other
// instructors appear only as anonymous points and network aggregates, and only as far as the released grid
// allows (./release): the network figures when it shows the scope, each other instructor as a point when
// they hold at least the smallest group's attempts, and the points of others only when there are at least
// as many of them as a group needs instructors.
import { eq } from "drizzle-orm";
import { standingMetricKeys, type StandingAnswer } from "../../shared/schemas/insight";
import { attemptErrorNames, type AttemptError } from "../../shared/scoring/scoreAttempt";
import { classifyAgainstFunnel, percentileRank } from "../../shared/stats";
import type { Db } from "../db/client";
import { instructors } from "../db/schema";
import { addTally, emptyTally, medianIn, mediansBy, talliesBy, type Tally } from "../metrics/summaries";
import { forbidden } from "../errors";
import { cached } from "./cache";
import { filtersKey, type ResolvedFilters } from "./filters";
import { funnelLimitCurve } from "./funnel";
import { classRows } from "./classes";
import { rateOf } from "./rates";
import { classConditions, scopeOf } from "./sql";
import { mayShow } from "./release";
import type { Viewer } from "./viewer";
import { errorLabels } from "../../shared/vocabulary";

type MetricKey = (typeof standingMetricKeys)[number];

/** The figures every instructor's standing shares for the same filters: computed once per database state. */
interface NetworkFigures {
  /** Attempts, passes and errors per instructor. */
  tallies: Map<number, Tally>;
  /** Per metric: each instructor's median. */
  byInstructor: Record<MetricKey, Map<number, number>>;
  medians: Record<MetricKey, number | null>;
  errors: Record<AttemptError, number>;
}

function networkFigures(db: Db, network: ResolvedFilters): NetworkFigures {
  return cached(db, `standing-network|${filtersKey(network)}`, () => {
    const scope = scopeOf(network);
    const byMetric = <T>(compute: (key: MetricKey) => T) => Object.fromEntries(standingMetricKeys.map((key) => [key, compute(key)])) as Record<MetricKey, T>;
    const tallies = talliesBy<number>(db, scope, "instructorId");
    return {
      tallies,
      byInstructor: byMetric((key) => mediansBy<number>(db, key, scope, "instructorId")),
      medians: byMetric((key) => medianIn(db, key, scope)),
      errors: [...tallies.values()].reduce(addTally, emptyTally()).errors,
    };
  });
}

export function standing(db: Db, viewer: Viewer, filters: ResolvedFilters): StandingAnswer {
  const me = viewer.ownInstructorId;
  if (me === null) throw forbidden("Your account is not linked to an instructor.");
  const self = db.select({ code: instructors.code, name: instructors.name }).from(instructors).where(eq(instructors.id, me)).get();
  if (!self) throw forbidden("Your account is not linked to an instructor.");

  const mine = { ...filters, instructorId: me };
  const min = viewer.suppressionMinCount;
  const network = { ...filters, instructorId: null };
  const { tallies, byInstructor, medians, errors: networkErrorCounts } = networkFigures(db, network);
  const perInstructor = [...tallies].map(([instructorId, { n, passed }]) => ({ instructorId, n, passed }));
  const totals = perInstructor.reduce((sum, row) => ({ n: sum.n + row.n, passed: sum.passed + row.passed }), { n: 0, passed: 0 });
  const myTally = perInstructor.find((row) => row.instructorId === me) ?? { instructorId: me, n: 0, passed: 0 };
  const networkHidden = !mayShow(db, viewer, scopeOf(network));
  // others shown as points and ranked against: each one person with enough attempts to be shown, and only
  // when the network is shown and enough of them are there that no point stands for a known colleague
  const others = perInstructor.filter((row) => row.instructorId !== me && row.n >= min);
  const othersShown = !networkHidden && others.length >= viewer.suppressionMinInstructors ? others : [];
  const shown = [...othersShown, ...perInstructor.filter((row) => row.instructorId === me)];
  const shownIds = new Set(shown.map((row) => row.instructorId));

  const metrics = standingMetricKeys.map((key) => {
    const mineValue = byInstructor[key].get(me) ?? null;
    const ranked = [...byInstructor[key]].filter(([id]) => shownIds.has(id)).map(([, median]) => median);
    return {
      key,
      mine: mineValue,
      network: networkHidden ? null : medians[key],
      percentileRank: mineValue === null || networkHidden || othersShown.length === 0 ? null : percentileRank(ranked, mineValue),
    };
  });

  const points = shown
    .map((row) => ({ medianScore: byInstructor.score.get(row.instructorId)!, passRate: row.passed / row.n, isMe: row.instructorId === me }))
    .sort((a, b) => a.medianScore - b.medianScore || a.passRate - b.passRate);

  const networkRate = networkHidden || totals.n === 0 ? null : totals.passed / totals.n;
  // the funnel's extent from the points shown only: the largest hidden group's size is not given away
  const nMax = Math.max(0, ...shown.map((row) => row.n));

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
      networkRate,
      method: "exact",
      curve: funnelLimitCurve(networkRate, nMax),
      me: {
        ...rateOf(myTally.passed, myTally.n),
        position: networkRate === null || myTally.n === 0 ? null : classifyAgainstFunnel(myTally.passed, myTally.n, networkRate),
      },
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
