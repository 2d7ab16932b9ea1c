// Drill-down on instructors: one row per instructor with pass rate, median score and funnel position against
// the network (adjusted for case mix unless asked otherwise); and one instructor's quarterly trend with their classes.
import { eq, sql } from "drizzle-orm";
import type { InstructorDetailAnswer, InstructorsAnswer } from "../../shared/schemas/insight";
import type { AdjustMode } from "../../shared/filters";
import type { Db } from "../db/client";
import { classes, instructors, sites } from "../db/schema";
import { instructorFunnel } from "../metrics/instructorFunnel";
import { mediansBy, talliesBy, talliesByInstructorStratum, totalsByInstructor } from "../metrics/summaries";
import { notFound } from "../errors";
import { classRows } from "./classes";
import type { ResolvedFilters } from "./filters";
import { funnelBlock, funnelComparison } from "./funnel";
import { trendQuarters } from "../../shared/period";
import { rateOf } from "./rates";
import { classConditions, scopeOf } from "./sql";

/** Instructors with their site, by id (one instructor when `id` is given). */
function instructorDirectory(db: Db, id?: number) {
  return new Map(
    db
      .select({ id: instructors.id, code: instructors.code, name: instructors.name, siteId: sites.id, siteCode: sites.code })
      .from(instructors)
      .leftJoin(sites, eq(instructors.siteId, sites.id))
      .where(id === undefined ? undefined : eq(instructors.id, id))
      .all()
      .map(({ siteId, siteCode, ...person }) => [person.id, { ...person, site: siteId !== null && siteCode !== null ? { id: siteId, code: siteCode } : null }]),
  );
}

export function instructorTable(db: Db, filters: ResolvedFilters, adjust: AdjustMode = "case-mix"): InstructorsAnswer {
  const scope = scopeOf(filters);
  // one read of the tallies by instructor and stratum serves the table's totals and the funnel
  const byStratum = talliesByInstructorStratum(db, { ...scope, instructorId: null });
  const inScope = scope.instructorId === null ? byStratum : new Map([...byStratum].filter(([id]) => id === scope.instructorId));
  const tallies = totalsByInstructor(inScope);
  const medians = mediansBy<number>(db, "score", scope, "instructorId");
  const summaries = new Map([...tallies].map(([id, { n, passed }]) => [id, { n, passed, median: medians.get(id)! }]));
  // classes come from the class logs (with a matching attempt when an attempt filter is set)
  const classCounts = new Map(
    db
      .select({ instructorId: classes.instructorId, n: sql<number>`count(*)` })
      .from(classes)
      .where(classConditions(filters))
      .groupBy(classes.instructorId)
      .all()
      .map((row) => [row.instructorId, row.n]),
  );
  const directory = instructorDirectory(db);
  const funnel = instructorFunnel(db, scope, adjust, byStratum);

  return {
    period: filters.period,
    funnel: funnelBlock(funnel),
    instructors: [...summaries]
      .map(([id, summary]) => {
        const person = directory.get(id);
        return {
          id,
          code: person?.code ?? `#${id}`,
          name: person?.name ?? "(unknown instructor)",
          site: person?.site ?? null,
          classes: classCounts.get(id) ?? 0,
          attempts: summary.n,
          passRate: rateOf(summary.passed, summary.n),
          medianScore: summary.median,
          ...funnelComparison(funnel.units.get(id)),
        };
      })
      .sort((a, b) => (a.code < b.code ? -1 : a.code > b.code ? 1 : 0)),
  };
}

export function instructorDetail(db: Db, instructorId: number, filters: ResolvedFilters): InstructorDetailAnswer {
  const person = instructorDirectory(db, instructorId).get(instructorId);
  if (!person) throw notFound("The instructor");
  const own = { ...filters, instructorId };
  const trend = trendQuarters(filters.period);
  const tallies = talliesBy<string>(db, scopeOf(own, trend), "quarter");
  const medians = mediansBy<string>(db, "score", scopeOf(own, trend), "quarter");
  const byQuarter = new Map([...tallies].map(([quarter, { n, passed }]) => [quarter, { n, passed, median: medians.get(quarter)! }]));
  return {
    period: filters.period,
    instructor: person,
    trend: trend.quarters.map((quarter) => ({
      quarter,
      passRate: rateOf(byQuarter.get(quarter)?.passed ?? 0, byQuarter.get(quarter)?.n ?? 0),
      medianScore: byQuarter.get(quarter)?.median ?? null,
    })),
    classes: classRows(db, classConditions(own)),
  };
}
