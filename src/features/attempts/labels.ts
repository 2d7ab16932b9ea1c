// How the drill-down pages write errors, numbers and times; the words themselves are in shared/vocabulary.
import type { AttemptError } from "../../../shared/scoring/scoreAttempt";
import { errorLabels } from "../../../shared/vocabulary";

export function errorLabel(error: AttemptError): string {
  return errorLabels[error];
}

/** A share 0–1 as "41.8 %"; null as "–". */
export function percent(share: number | null | undefined, decimals = 1): string {
  if (share === null || share === undefined || !Number.isFinite(share)) return "–";
  return `${(share * 100).toFixed(decimals)} %`;
}

/** A percentage already 0–100 as "41.8 %". */
export function percentOf100(value: number | null | undefined, decimals = 0): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  return `${value.toFixed(decimals)} %`;
}

/** A share 0–1 rounded to a number of percent with one decimal, for tables and CSV. */
export function percentNumber(share: number | null | undefined): number | null {
  if (share === null || share === undefined || !Number.isFinite(share)) return null;
  return Math.round(share * 1000) / 10;
}

export function wholeNumber(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  return Math.round(value).toLocaleString("en-GB");
}

/** "2026-11-30T09:24:05Z" → "30 Nov 2026, 09:24" (UTC: times are shown as the device recorded them). */
export function dateTime(iso: string): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  return date.toLocaleString("en-GB", { day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit", timeZone: "UTC" });
}

export function dateOnly(iso: string | null): string {
  if (!iso) return "–";
  const date = new Date(iso.length === 10 ? `${iso}T00:00:00Z` : iso);
  if (Number.isNaN(date.getTime())) return iso;
  return date.toLocaleDateString("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
}
