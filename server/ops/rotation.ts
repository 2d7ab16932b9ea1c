// Which backups to keep: the newest of each of the last `daily` days, of the last `weekly` ISO weeks and of the
// last `monthly` months (the usual grandfather-father-son rotation); every other backup may be deleted.
// Calendar days, weeks and months are taken in UTC, as the schedule is.

export interface KeepCounts {
  daily: number;
  weekly: number;
  monthly: number;
}

export interface BackupEntry {
  file: string;
  takenAt: Date;
}

const dayKey = (d: Date) => d.toISOString().slice(0, 10);
const monthKey = (d: Date) => d.toISOString().slice(0, 7);

/** ISO 8601 week: weeks start on Monday and belong to the year of their Thursday. */
function weekKey(d: Date): string {
  const day = new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate()));
  const weekday = day.getUTCDay() || 7;
  day.setUTCDate(day.getUTCDate() + 4 - weekday); // the Thursday of this week
  const yearStart = Date.UTC(day.getUTCFullYear(), 0, 1);
  const week = Math.ceil(((day.getTime() - yearStart) / 86_400_000 + 1) / 7);
  return `${day.getUTCFullYear()}-W${String(week).padStart(2, "0")}`;
}

/** The newest backup of each of the `count` most recent periods that have one. */
function newestPerPeriod(newestFirst: BackupEntry[], key: (d: Date) => string, count: number): string[] {
  const seen = new Set<string>();
  const kept: string[] = [];
  for (const backup of newestFirst) {
    const period = key(backup.takenAt);
    if (seen.has(period)) continue;
    if (seen.size >= count) break;
    seen.add(period);
    kept.push(backup.file);
  }
  return kept;
}

export function backupsToKeep(backups: BackupEntry[], keep: KeepCounts): Set<string> {
  const newestFirst = [...backups].sort((a, b) => b.takenAt.getTime() - a.takenAt.getTime());
  return new Set([
    ...newestPerPeriod(newestFirst, dayKey, keep.daily),
    ...newestPerPeriod(newestFirst, weekKey, keep.weekly),
    ...newestPerPeriod(newestFirst, monthKey, keep.monthly),
  ]);
}
