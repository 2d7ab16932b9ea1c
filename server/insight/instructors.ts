// Drill-down on instructors: one row per instructor with pass rate, median score and funnel position against
// the network rate; and one instructor's quarterly trend with their classes.
import { eq, sql } from "drizzle-orm";
import type { InstructorDetailAnswer, InstructorsAnswer } from "../../shared/schemas/insight";
import { classifyAgainstFunnel } from "../../shared/stats";
import type { Db } from "../db/client";
import { attempts, instructors, sites } from "../db/schema";
import { notFound } from "../errors";
import { classRows } from "./classes";
import type { ResolvedFilters } from "./filters";
import { funnelLimitCurve } from "./funnel";
import { trendQuarters } from "./quarters";
import { rateOf } from "./rates";
import { attemptConditions, classConditions, mediansBy } from "./sql";

function instructorDirectory(db: Db) {
  return new Map(
    db
      .select({ id: instructors.id, code: instructors.code, name: instructors.name, siteId: sites.id, siteCode: sites.code })
      .from(instructors)
      .leftJoin(sites, eq(instructors.siteId, sites.id))
      .all()
      .map((row) => [row.id, row]),
  );
}

export function instructorTable(db: Db, filters: ResolvedFilters): InstructorsAnswer {
  const where = attemptConditions(filters);
  const rows = db
    .select({
      instructorId: attempts.instructorId,
      n: sql<number>`count(*)`,
      passed: sql<number>`sum(${attempts.passed})`,
      classes: sql<number>`count(DISTINCT ${attempts.classId})`,
    })
    .from(attempts)
    .where(where)
    .groupBy(attempts.instructorId)
    .all();
  const medians = mediansBy<number>(db, attempts.score, attempts.instructorId, where);
  const directory = instructorDirectory(db);
  const total = rows.reduce((sum, row) => ({ n: sum.n + row.n, passed: sum.passed + row.passed }), { n: 0, passed: 0 });
  const networkRate = total.n === 0 ? null : total.passed / total.n;
  // many instructors share a size and a pass count; classify each pair once
  const positions = new Map<string, ReturnType<typeof classifyAgainstFunnel>>();
  const positionOf = (passed: number, n: number) => {
    const key = `${passed}/${n}`;
    if (!positions.has(key)) positions.set(key, networkRate === null ? null : classifyAgainstFunnel(passed, n, networkRate));
    return positions.get(key)!;
  };

  return {
    period: filters.period,
    funnel: { networkRate, method: "exact", curve: funnelLimitCurve(networkRate, Math.max(0, ...rows.map((row) => row.n))) },
    instructors: rows
      .map((row) => {
        const person = directory.get(row.instructorId);
        return {
          id: row.instructorId,
          code: person?.code ?? `#${row.instructorId}`,
          name: person?.name ?? "(unknown instructor)",
          site: person?.siteId != null && person.siteCode != null ? { id: person.siteId, code: person.siteCode } : null,
          classes: row.classes,
          attempts: row.n,
          passRate: rateOf(row.passed, row.n),
          medianScore: medians.get(row.instructorId) ?? null,
          position: positionOf(row.passed, row.n),
        };
      })
      .sort((a, b) => (a.code < b.code ? -1 : a.code > b.code ? 1 : 0)),
  };
}

export function instructorDetail(db: Db, instructorId: number, filters: ResolvedFilters): InstructorDetailAnswer {
  const person = instructorDirectory(db).get(instructorId);
  if (!person) throw notFound("The instructor");
  const own = { ...filters, instructorId };
  const trend = trendQuarters(filters.period);
  const trendWhere = attemptConditions(own, trend);
  const byQuarter = new Map(
    db
      .select({ quarter: attempts.quarter, n: sql<number>`count(*)`, passed: sql<number>`sum(${attempts.passed})` })
      .from(attempts)
      .where(trendWhere)
      .groupBy(attempts.quarter)
      .all()
      .map((row) => [row.quarter, row]),
  );
  const medians = mediansBy<string>(db, attempts.score, attempts.quarter, trendWhere);
  return {
    period: filters.period,
    instructor: {
      id: person.id,
      code: person.code,
      name: person.name,
      site: person.siteId != null && person.siteCode != null ? { id: person.siteId, code: person.siteCode } : null,
    },
    trend: trend.quarters.map((quarter) => ({
      quarter,
      passRate: rateOf(byQuarter.get(quarter)?.passed ?? 0, byQuarter.get(quarter)?.n ?? 0),
      medianScore: medians.get(quarter) ?? null,
    })),
    classes: classRows(db, classConditions(own)),
  };
}
