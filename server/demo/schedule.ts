// When and where the network's classes ran: date, site, instructor, course, class size and the manikins put
// out for it. At most one class per site and day, so each manikin serves at most one class a day.
import { courseTypes, type CourseType } from "../../shared/domain";
import type { PatientType } from "../../shared/scoring/policy";
import { quarterAtIndex, quarterDates } from "../../shared/period";
import { addDays, daysBetween, weekday } from "./calendar";
import { isInUse, type Manikin } from "./fleet";
import type { Random } from "./random";
import type { DemoScenario, ScenarioInstructor } from "./scenario";
import type { Timeline } from "./timeline";

export interface PlannedClass {
  id: string;
  date: string;
  quarter: number;
  site: string;
  instructor: ScenarioInstructor;
  course: CourseType;
  learners: number;
  /** Start of the class, minutes after midnight UTC. */
  startMinute: number;
  /** Manikins put out for the class, per patient type practised. */
  stations: Partial<Record<PatientType, Manikin[]>>;
}

export const profilesOfCourse: Record<CourseType, PatientType[]> = {
  adult: ["adult"],
  child: ["child"],
  infant: ["infant"],
  "all-ages": ["adult", "child", "infant"],
};

const START_MINUTES = [9 * 60, 13 * 60 + 30, 18 * 60];

export function planClasses(scenario: DemoScenario, timeline: Timeline, fleet: Manikin[], random: Random): PlannedClass[] {
  const taken = new Set<string>(); // site|date
  const planned: Omit<PlannedClass, "id">[] = [];
  timeline.quarters.forEach((quarter, k) => {
    const { first, last } = quarterDates(quarterAtIndex(quarter));
    const days = teachingDays(first, last, timeline.lastClassDay);
    if (days.length === 0) return;
    // The current quarter is only partly over: it gets its share of a full quarter's classes.
    const fullDays = teachingDays(first, last, last).length;
    const perFullQuarter = scenario.classes.firstQuarter + scenario.classes.growthPerQuarter * k;
    const count = Math.round((perFullQuarter * days.length) / fullDays);
    for (let i = 0; i < count; i++) {
      const instructor = random.weighted(scenario.instructors, (x) => x.workload);
      const site = random.chance(scenario.classes.homeSiteShare) ? instructor.site : random.pick(scenario.sites.filter((s) => s.code !== instructor.site)).code;
      const date = freeDay(days, site, taken, random);
      if (!date) continue; // every day of the quarter is already taken at this site
      taken.add(`${site}|${date}`);
      const course = random.weighted(courseTypes, (c) => scenario.classes.courseMix[c]);
      const learners = random.int(scenario.classes.learners[0], scenario.classes.learners[1]);
      planned.push({
        date,
        quarter,
        site,
        instructor,
        course,
        learners,
        startMinute: random.pick(START_MINUTES),
        stations: pickStations(fleet, site, date, profilesOfCourse[course], learners, random),
      });
    }
  });
  planned.sort((a, b) => a.date.localeCompare(b.date) || a.site.localeCompare(b.site));
  return planned.map((c, i) => ({ id: `CL-${String(i + 1).padStart(4, "0")}`, ...c }));
}

/** Monday to Saturday from `from` to `to`, not after `last`. */
function teachingDays(from: string, to: string, last: string): string[] {
  const end = to < last ? to : last;
  const days: string[] = [];
  for (let i = 0, n = daysBetween(from, end); i <= n; i++) {
    const day = addDays(from, i);
    if (weekday(day) !== 0) days.push(day);
  }
  return days;
}

function freeDay(days: string[], site: string, taken: Set<string>, random: Random): string | null {
  for (let attempt = 0; attempt < 40; attempt++) {
    const day = random.pick(days);
    if (!taken.has(`${site}|${day}`)) return day;
  }
  return days.find((day) => !taken.has(`${site}|${day}`)) ?? null;
}

function pickStations(
  fleet: Manikin[],
  site: string,
  date: string,
  profiles: PatientType[],
  learners: number,
  random: Random,
): Partial<Record<PatientType, Manikin[]>> {
  const stations: Partial<Record<PatientType, Manikin[]>> = {};
  for (const profile of profiles) {
    const usable = fleet.filter((m) => m.site === site && m.patientType === profile && isInUse(m, date));
    if (usable.length === 0) {
      throw new Error(`No ${profile} manikin is in use at ${site} on ${date}; the scenario's fleet is too small`);
    }
    const wanted = Math.min(usable.length, 2 + Math.floor(learners / 5));
    stations[profile] = random
      .shuffled(usable)
      .slice(0, wanted)
      .sort((a, b) => a.assetId.localeCompare(b.assetId));
  }
  return stations;
}
