// Each signal in one line, and the page behind it that a role may open: what the alerts history keeps of a
// digest. Instructors are named by code only, as in the digest.
import { can } from "../../shared/permissions";
import { quarterLabel } from "../../shared/period";
import type { UserRole } from "../../shared/domain";
import type { TaggedSignal } from "./signals";

const MONTHS = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];

/** "2026-05" as "May 2026": the digest is plain text in one fixed format, like the funder PDF. */
export function monthLabel(month: string): string {
  const [year, index] = month.split("-").map(Number);
  return `${MONTHS[index - 1] ?? month} ${year}`;
}

export function monthsLabel(count: number): string {
  return `${count} month${count === 1 ? "" : "s"}`;
}

export function scopeLabel(siteCode: string | null): string {
  return siteCode === null ? "The network" : `Site ${siteCode}`;
}

export function signalLine(item: TaggedSignal): string {
  switch (item.kind) {
    case "funnel":
      return `${item.signal.instructorCode} ${item.signal.side} the 99.8 % funnel limits in ${quarterLabel(item.signal.quarter)} (${item.signal.passed} of ${item.signal.attempts} attempts passed)`;
    case "shift":
      return `${scopeLabel(item.signal.siteCode)}: monthly pass rate ${item.signal.direction} its median for ${monthsLabel(item.signal.months)} since ${monthLabel(item.signal.since)}`;
    case "service":
      return `${item.signal.assetId}${item.signal.siteCode ? ` (${item.signal.siteCode})` : ""} due for service: ${item.signal.reason}`;
    case "drift":
      return `${item.signal.assetId}${item.signal.siteCode ? ` (${item.signal.siteCode})` : ""} reads ${item.signal.offsetMm > 0 ? "deeper" : "shallower"} than its peers in the same classes`;
    case "noData":
      return `Site ${item.signal.siteCode}: no attempts or class logs in ${quarterLabel(item.signal.quarter)}, after some in ${quarterLabel(item.signal.previous)}`;
  }
}

/** The in-app page behind a signal, when the role may open it. */
export function signalLink(role: UserRole, item: TaggedSignal): { label: string; path: string } | null {
  const overview = (siteCode: string | null) =>
    can(role, "readNetwork") ? { label: "Network overview", path: siteCode === null ? "/overview" : `/overview?site=${encodeURIComponent(siteCode)}` } : null;
  switch (item.kind) {
    case "funnel":
      if (can(role, "drillDown", "any")) return { label: `Instructor ${item.signal.instructorCode}`, path: `/instructors/${item.signal.instructorId}` };
      return can(role, "readOwnStanding") ? { label: "My standing", path: "/my-standing" } : null;
    case "shift":
      return overview(item.signal.siteCode);
    case "service":
    case "drift":
      return can(role, "readEquipment")
        ? { label: `Manikin ${item.signal.assetId}`, path: `/equipment/manikins/${encodeURIComponent(item.signal.assetId)}` }
        : null;
    case "noData":
      return can(role, "readTracker") ? { label: "Quarter tracker", path: "/tracker" } : overview(item.signal.siteCode);
  }
}
