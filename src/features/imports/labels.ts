// Words and number formats shared by the import pages.
import { formatCount } from "../../lib/formatting";
import type { ImportKind } from "../../../shared/domain";
import type { ImportBatch } from "../../../shared/import/api";

export const kindLabels: Record<ImportKind, string> = {
  classes: "Class logs",
  attempts: "Attempt summaries",
  compressions: "Compression streams",
  equipment: "Equipment events",
};

export const kindHints: Record<ImportKind, string> = {
  classes: "One row per class: date, site, instructor, course, learners and how many completed.",
  attempts: "One row per measured attempt: the manikin's summary of rate, depth, recoil and pauses.",
  compressions: "One row per compression: time, depth and release, grouped into attempts by attempt id.",
  equipment: "One row per event in a manikin's life: commissioned, parts replaced, serviced, faults, retired.",
};

/** Who made a batch: the signed-in user's address, or where it came from without one. */
export function importedBy(batch: ImportBatch): string {
  if (batch.userEmail) return batch.userEmail;
  return batch.source === "seed" ? "Demo data" : "Command line";
}

export const unitLabels = {
  depth: { mm: "millimetres (mm)", cm: "centimetres (cm)", in: "inches (in)" },
  time: { ms: "milliseconds (ms)", s: "seconds (s)" },
  shares: { percent: "percentages, 0–100", fraction: "fractions, 0–1" },
} as const;

export function plural(count: number, one: string, many: string = `${one}s`): string {
  return `${formatCount(count)} ${count === 1 ? one : many}`;
}

export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} bytes`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(bytes < 10 * 1024 ? 1 : 0)} kB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

// the import pages and the System page read these from here; they are the one formatting module's
export { formatCount, formatDateTime } from "../../lib/formatting";
