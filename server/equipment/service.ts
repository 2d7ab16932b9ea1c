// The manikin fleet, consumables per 100 learners and the list of what needs attention, judged against the
// equipment thresholds of the network policy (project defaults unless the network changed them).
import { and, between, eq, gte, inArray, isNotNull, lt, sql, type SQL } from "drizzle-orm";
import { quarterOf, trendQuarters } from "../../shared/period";
import type { EquipmentAnswer } from "../../shared/schemas/equipment";
import { DEFAULT_POLICY, type EquipmentPolicy } from "../../shared/scoring/policy";
import type { Db } from "../db/client";
import { attempts, classes, equipmentEvents, manikins, sites } from "../db/schema";
import type { ResolvedFilters } from "../insight/filters";
import { networkScope, talliesByPair } from "../metrics/summaries";
import { writtenDate } from "../../shared/writtenDate";

const DAY_MS = 86_400_000;

export interface EquipmentScope {
  filters: ResolvedFilters;
  /** Only this instructor's classes in the mouthpiece check (an instructor's view); null = every class. */
  onlyInstructorId: number | null;
  /** "YYYY-MM-DD": the day service intervals are measured to. */
  asOf: string;
  /**
   * Whether the viewer may see a manikin's attempts and compressions in a quarter (the released grid of the
   * insight pages, for viewers who do not see everyone); every one when left out.
   */
  usageShown?: (manikinId: number, quarter: string) => boolean;
}

/** The quarter of an ISO date in SQL, e.g. 2026-08-14 → 2026-Q3. */
function quarterOfDate(date: SQL | typeof equipmentEvents.date): SQL<string> {
  return sql<string>`substr(${date}, 1, 4) || '-Q' || ((CAST(substr(${date}, 6, 2) AS INTEGER) + 2) / 3)`;
}

/**
 * The class logs count consumables per learner taught; the equipment log records the same work per manikin.
 * Adding the two would count a cleaning twice, so the figure (as in the funder report) is the class logs'
 * count, and the equipment log's count is given beside it for checking one record against the other.
 */
function consumable(fromClassLogs: number, fromEvents: number, learners: number) {
  const total = fromClassLogs;
  return { fromClassLogs, fromEvents, total, per100Learners: learners === 0 ? null : (100 * total) / learners };
}

export function thresholds(policy: EquipmentPolicy): EquipmentAnswer["thresholds"] {
  const entry = (key: keyof EquipmentPolicy) => ({
    value: policy[key],
    projectDefault: policy[key] === DEFAULT_POLICY.equipment[key],
    defaultValue: DEFAULT_POLICY.equipment[key],
  });
  return {
    serviceEveryCompressions: entry("serviceEveryCompressions"),
    serviceEveryDays: entry("serviceEveryDays"),
    minMouthpieceCleansPerLearner: entry("minMouthpieceCleansPerLearner"),
    note: "These thresholds are project defaults that the network may change in its policy; they are not taken from a guideline or a manufacturer.",
  };
}

export function equipmentReport(db: Db, policy: EquipmentPolicy, scope: EquipmentScope): EquipmentAnswer {
  const fleetRows = fleetRecords(db, scope);
  return {
    period: scope.filters.period,
    asOf: scope.asOf,
    thresholds: thresholds(policy),
    fleet: fleetRows,
    consumables: consumablesBySiteQuarter(db, scope.filters),
    attention: [...fleetAttention(fleetRows, policy, scope.asOf), ...mouthpieceAttention(db, policy, scope)],
  };
}

/** The manikins the filters select, with their use per quarter of the trend window and their service state. */
export function fleetRecords(db: Db, scope: EquipmentScope): EquipmentAnswer["fleet"] {
  const { filters } = scope;
  const trend = trendQuarters(filters.period);

  const fleetConditions: SQL[] = [];
  if (filters.siteId !== null) fleetConditions.push(eq(manikins.siteId, filters.siteId));
  if (filters.manikinId !== null) fleetConditions.push(eq(manikins.id, filters.manikinId));
  if (filters.profile !== null) fleetConditions.push(eq(manikins.patientType, filters.profile));
  const fleet = db
    .select({ manikin: manikins, siteCode: sites.code })
    .from(manikins)
    .leftJoin(sites, eq(manikins.siteId, sites.id))
    .where(and(...fleetConditions))
    .orderBy(manikins.assetId)
    .all();
  const ids = fleet.map((row) => row.manikin.id);
  // every manikin: no need to list them in the query
  const onFleet = (column: typeof attempts.manikinId | typeof equipmentEvents.manikinId) =>
    fleetConditions.length === 0 ? isNotNull(column) : inArray(column, ids.length ? ids : [-1]);

  // attempts and compressions per manikin and quarter, from the attempt summaries
  const fleetIds = new Set(ids);
  const usage = [...talliesByPair(db, networkScope(trend.from, trend.to), "manikinId", "quarter")]
    .map(([key, tally]) => {
      const [manikinId, quarter] = key.split("|");
      return { manikinId: Number(manikinId), quarter, n: tally.n, compressions: tally.compressions };
    })
    .filter((row) => fleetIds.has(row.manikinId));
  const usageOf = new Map(usage.map((row) => [`${row.manikinId}|${row.quarter}`, row]));

  const events = db
    .select({
      manikinId: equipmentEvents.manikinId,
      lastService: sql<string | null>`max(CASE WHEN ${equipmentEvents.event} = 'serviced' THEN ${equipmentEvents.date} END)`,
      openFaults: sql<number>`sum(${equipmentEvents.event} = 'fault' AND ${equipmentEvents.resolved} = 0)`,
    })
    .from(equipmentEvents)
    .where(onFleet(equipmentEvents.manikinId))
    .groupBy(equipmentEvents.manikinId)
    .all();
  const eventsOf = new Map(events.map((row) => [row.manikinId, row]));

  // compressions since each manikin's last service: from the quarter of that service on (manikin/quarter index),
  // then by day; an attempt on the service day counts after it, as the log has no time of day and counting it
  // errs towards servicing early
  const sinceServiceOf = db
    .select({ compressions: sql<number>`coalesce(sum(${attempts.compressions}), 0)` })
    .from(attempts)
    .where(
      and(
        eq(attempts.manikinId, sql.placeholder("manikinId")),
        gte(attempts.quarter, sql.placeholder("quarter")),
        sql`substr(${attempts.startedAt}, 1, 10) >= ${sql.placeholder("day")}`,
      ),
    )
    .prepare();
  const sinceService = new Map(
    ids.map((id) => {
      const day = eventsOf.get(id)?.lastService ?? "";
      return [id, sinceServiceOf.get({ manikinId: id, quarter: day ? quarterOf(day) : "", day })!.compressions];
    }),
  );

  return fleet.map(({ manikin: m, siteCode }) => ({
    id: m.id,
    assetId: m.assetId,
    patientType: m.patientType,
    site: m.siteId !== null && siteCode !== null ? { id: m.siteId, code: siteCode } : null,
    inServiceSince: m.inServiceSince,
    retiredOn: m.retiredOn,
    usage: trend.quarters.map((quarter) => {
      const row = usageOf.get(`${m.id}|${quarter}`);
      if (row && scope.usageShown && !scope.usageShown(m.id, quarter)) return { quarter, attempts: null, compressions: null };
      return { quarter, attempts: row?.n ?? 0, compressions: row?.compressions ?? 0 };
    }),
    compressionsSinceService: sinceService.get(m.id) ?? 0,
    lastServiceDate: eventsOf.get(m.id)?.lastService ?? null,
    openFaults: eventsOf.get(m.id)?.openFaults ?? 0,
  }));
}

function consumablesBySiteQuarter(db: Db, filters: ResolvedFilters): EquipmentAnswer["consumables"] {
  const { from, to } = filters.period;
  const classConditions: SQL[] = [between(classes.quarter, from, to)];
  if (filters.siteId !== null) classConditions.push(eq(classes.siteId, filters.siteId));
  const fromLogs = db
    .select({
      siteId: classes.siteId,
      quarter: classes.quarter,
      learners: sql<number>`sum(${classes.learners})`,
      lungs: sql<number>`coalesce(sum(${classes.lungsReplaced}), 0)`,
      mouthpieces: sql<number>`coalesce(sum(${classes.mouthpiecesCleaned}), 0)`,
      batteries: sql<number>`coalesce(sum(${classes.batteriesReplaced}), 0)`,
    })
    .from(classes)
    .where(and(...classConditions))
    .groupBy(classes.siteId, classes.quarter)
    .all();

  const eventSite = sql<number>`coalesce(${equipmentEvents.siteId}, ${manikins.siteId})`;
  const eventQuarter = quarterOfDate(equipmentEvents.date);
  const eventConditions: SQL[] = [sql`${eventQuarter} BETWEEN ${from} AND ${to}`, isNotNull(eventSite)];
  if (filters.siteId !== null) eventConditions.push(sql`${eventSite} = ${filters.siteId}`);
  const quantity = (event: string) => sql<number>`coalesce(sum(CASE WHEN ${equipmentEvents.event} = ${event} THEN ${equipmentEvents.quantity} END), 0)`;
  const fromEvents = db
    .select({
      siteId: eventSite,
      quarter: eventQuarter,
      lungs: quantity("lung_replaced"),
      mouthpieces: quantity("mouthpiece_cleaned"),
      batteries: quantity("battery_replaced"),
    })
    .from(equipmentEvents)
    .innerJoin(manikins, eq(equipmentEvents.manikinId, manikins.id))
    .where(and(...eventConditions))
    .groupBy(eventSite, eventQuarter)
    .all();

  const siteCodes = new Map(
    db
      .select({ id: sites.id, code: sites.code })
      .from(sites)
      .all()
      .map((row) => [row.id, row.code]),
  );
  const cells = new Map<string, { siteId: number; quarter: string; learners: number; logs: [number, number, number]; events: [number, number, number] }>();
  const cell = (siteId: number, quarter: string) => {
    const key = `${siteId}|${quarter}`;
    if (!cells.has(key)) cells.set(key, { siteId, quarter, learners: 0, logs: [0, 0, 0], events: [0, 0, 0] });
    return cells.get(key)!;
  };
  for (const row of fromLogs) {
    const c = cell(row.siteId, row.quarter);
    c.learners += row.learners;
    c.logs = [row.lungs, row.mouthpieces, row.batteries];
  }
  for (const row of fromEvents) cell(row.siteId, row.quarter).events = [row.lungs, row.mouthpieces, row.batteries];
  return [...cells.values()]
    .filter((c) => siteCodes.has(c.siteId))
    .sort((a, b) =>
      siteCodes.get(a.siteId)! < siteCodes.get(b.siteId)! ? -1 : siteCodes.get(a.siteId)! > siteCodes.get(b.siteId)! ? 1 : a.quarter < b.quarter ? -1 : 1,
    )
    .map((c) => ({
      site: { id: c.siteId, code: siteCodes.get(c.siteId)! },
      quarter: c.quarter,
      learners: c.learners,
      lungs: consumable(c.logs[0], c.events[0], c.learners),
      mouthpieces: consumable(c.logs[1], c.events[1], c.learners),
      batteries: consumable(c.logs[2], c.events[2], c.learners),
    }));
}

/** Services due by compressions or by days, and open faults, for each manikin still in service. */
export function fleetAttention(fleet: EquipmentAnswer["fleet"], policy: EquipmentPolicy, asOf: string): EquipmentAnswer["attention"] {
  const items: EquipmentAnswer["attention"] = [];
  for (const m of fleet) {
    if (m.retiredOn !== null && m.retiredOn <= asOf) continue;
    const base = { site: m.site, manikin: { id: m.id, assetId: m.assetId }, classId: null };
    if (m.compressionsSinceService > policy.serviceEveryCompressions) {
      items.push({
        ...base,
        kind: "service_by_compressions",
        reason: `${m.compressionsSinceService.toLocaleString("en-GB")} compressions since ${m.lastServiceDate ? `the last service on ${writtenDate(m.lastServiceDate)}` : "it came into use"}; service is due every ${policy.serviceEveryCompressions.toLocaleString("en-GB")}.`,
      });
    }
    const since = m.lastServiceDate ?? m.inServiceSince;
    const days = since === null ? null : Math.floor((Date.parse(`${asOf}T00:00:00Z`) - Date.parse(`${since}T00:00:00Z`)) / DAY_MS);
    if (days === null || days > policy.serviceEveryDays) {
      items.push({
        ...base,
        kind: "service_by_days",
        reason:
          since === null || days === null
            ? `No service and no date in use are recorded; service is due every ${policy.serviceEveryDays} days.`
            : `${days} days since ${m.lastServiceDate ? `the last service on ${writtenDate(m.lastServiceDate)}` : `it came into use on ${writtenDate(since)} with no service recorded`}; service is due every ${policy.serviceEveryDays} days.`,
      });
    }
    if (m.openFaults > 0) {
      items.push({ ...base, kind: "open_fault", reason: `${m.openFaults} reported fault${m.openFaults === 1 ? " is" : "s are"} not yet resolved.` });
    }
  }
  return items;
}

function mouthpieceAttention(db: Db, policy: EquipmentPolicy, scope: EquipmentScope): EquipmentAnswer["attention"] {
  const { filters } = scope;
  const conditions: SQL[] = [
    between(classes.quarter, filters.period.from, filters.period.to),
    isNotNull(classes.mouthpiecesCleaned),
    lt(classes.mouthpiecesCleaned, sql`${classes.learners} * ${policy.minMouthpieceCleansPerLearner}`),
  ];
  if (filters.siteId !== null) conditions.push(eq(classes.siteId, filters.siteId));
  if (scope.onlyInstructorId !== null) conditions.push(eq(classes.instructorId, scope.onlyInstructorId));
  return db
    .select({
      id: classes.id,
      date: classes.date,
      siteId: classes.siteId,
      siteCode: sites.code,
      learners: classes.learners,
      cleaned: classes.mouthpiecesCleaned,
    })
    .from(classes)
    .innerJoin(sites, eq(classes.siteId, sites.id))
    .where(and(...conditions))
    .orderBy(classes.date, classes.id)
    .all()
    .map((row) => ({
      kind: "mouthpiece_cleaning" as const,
      site: { id: row.siteId, code: row.siteCode },
      manikin: null,
      classId: row.id,
      reason: `Class ${row.id} on ${writtenDate(row.date)}: ${row.cleaned} mouthpiece cleans logged for ${row.learners} learners; at least ${row.learners * policy.minMouthpieceCleansPerLearner} expected (${policy.minMouthpieceCleansPerLearner} per learner).`,
    }));
}
