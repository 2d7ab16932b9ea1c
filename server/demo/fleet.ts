// The network's manikins and their lives: when each came into use, its yearly services, faults, repairs and
// retirement. The class schedule asks the fleet which manikins can be used on a day.
import { patientTypes, type PatientType } from "../../shared/scoring/policy";
import { addDays, daysBetween } from "./calendar";
import type { Random } from "./random";
import type { DemoScenario } from "./scenario";
import type { Timeline } from "./timeline";

export interface DatedNote {
  date: string;
  note: string;
}

export interface Manikin {
  assetId: string;
  site: string;
  patientType: PatientType;
  commissioned: DatedNote;
  services: DatedNote[];
  faults: (DatedNote & { repaired: DatedNote | null })[];
  retired: DatedNote | null;
  /** Days on which the manikin cannot be used: from (included) to (excluded; null = still out of use). */
  outOfUse: { from: string; to: string | null }[];
}

const typeLetter: Record<PatientType, string> = { adult: "A", child: "C", infant: "I" };

/** A new manikin is serviced first at its site's service day at least this long after it came into use. */
const FIRST_SERVICE_AFTER_DAYS = 120;

export function buildFleet(scenario: DemoScenario, timeline: Timeline, random: Random): Manikin[] {
  const manikins: Manikin[] = [];
  for (const site of scenario.sites) {
    // Each site received its manikins on one day shortly before the history starts.
    const commissioned = addDays(timeline.firstDay, -random.int(20, 110));
    for (const patientType of patientTypes) {
      const count = scenario.fleet.perSite[site.code]?.[patientType] ?? 0;
      for (let n = 1; n <= count; n++) {
        manikins.push(
          newManikin(`${site.code}-${typeLetter[patientType]}${String(n).padStart(2, "0")}`, site.code, patientType, {
            date: commissioned,
            note: `Delivered to ${site.name}`,
          }),
        );
      }
    }
  }
  for (const arrival of scenario.fleet.arrivals) {
    manikins.push(
      newManikin(arrival.manikin, arrival.site, arrival.patientType, {
        date: timeline.shiftDate(arrival.commissioned),
        note: arrival.note,
      }),
    );
  }
  const byId = new Map(manikins.map((m) => [m.assetId, m]));

  for (const incident of scenario.fleet.incidents) {
    const manikin = byId.get(incident.manikin);
    if (!manikin) throw new Error(`Scenario incident names an unknown manikin ${incident.manikin}`);
    const fault = timeline.shiftDate(incident.fault);
    const repaired = incident.repaired ? { date: timeline.shiftDate(incident.repaired), note: incident.repairNote ?? "Repaired" } : null;
    manikin.faults.push({ date: fault, note: incident.faultNote, repaired });
    if (incident.retired) {
      manikin.retired = { date: timeline.shiftDate(incident.retired), note: incident.retiredNote ?? "Retired" };
    }
    manikin.outOfUse.push({ from: fault, to: repaired?.date ?? null });
  }

  for (const manikin of manikins) {
    manikin.services = yearlyServices(manikin, scenario, timeline);
  }
  const overdue = byId.get(scenario.fleet.overdueService);
  if (!overdue) throw new Error(`Scenario names an unknown overdue manikin ${scenario.fleet.overdueService}`);
  // The most recent service did not happen, so the one before it is now more than a year ago.
  overdue.services.pop();

  return manikins.sort((a, b) => a.assetId.localeCompare(b.assetId));
}

function newManikin(assetId: string, site: string, patientType: PatientType, commissioned: DatedNote): Manikin {
  return { assetId, site, patientType, commissioned, services: [], faults: [], retired: null, outOfUse: [] };
}

function yearlyServices(manikin: Manikin, scenario: DemoScenario, timeline: Timeline): DatedNote[] {
  const site = scenario.sites.find((s) => s.code === manikin.site);
  if (!site) throw new Error(`Manikin ${manikin.assetId} belongs to an unknown site ${manikin.site}`);
  const services: DatedNote[] = [];
  const firstYear = Number(manikin.commissioned.date.slice(0, 4));
  const lastYear = Number(timeline.today.slice(0, 4)) + 1;
  for (let year = firstYear; year <= lastYear; year++) {
    // Written on the reference calendar, then moved with the rest of the story.
    const date = timeline.shiftDate(`${year}-${site.serviceDay}`);
    if (daysBetween(manikin.commissioned.date, date) < FIRST_SERVICE_AFTER_DAYS) continue;
    if (date > timeline.today) continue;
    if (manikin.retired && date >= manikin.retired.date) continue;
    if (manikin.outOfUse.some((span) => date >= span.from && (span.to === null || date < span.to))) continue;
    services.push({ date, note: "Yearly service: sensors calibrated, springs and valves checked" });
  }
  return services;
}

export function isInUse(manikin: Manikin, date: string): boolean {
  if (date < manikin.commissioned.date) return false;
  if (manikin.retired && date >= manikin.retired.date) return false;
  return !manikin.outOfUse.some((span) => date >= span.from && (span.to === null || date < span.to));
}
