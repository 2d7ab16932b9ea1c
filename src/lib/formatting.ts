// The one place the client turns dates and counts into text, in the user's locale (the browser's first
// language), so every page writes a date the same way ("2 Dec 2026" for en-GB, "Dec 2, 2026" for en-US)
// and never two ways side by side. Times of events are shown in the user's time zone; times a device
// recorded, and calendar dates, as written (UTC). The funder PDF keeps its own fixed format on the server.

const FALLBACK_LOCALE = "en-GB";

let chosenLocale: string | null = null;
let browserLocale: string | null = null;

/** The locale every format uses: one set with `setFormatLocale`, else the browser's first language. */
export function formatLocale(): string {
  if (chosenLocale) return chosenLocale;
  if (!browserLocale) {
    const nav = typeof navigator === "undefined" ? undefined : navigator;
    const wanted = nav?.languages?.[0] ?? nav?.language;
    browserLocale = wanted && isKnownLocale(wanted) ? wanted : FALLBACK_LOCALE;
  }
  return browserLocale;
}

function isKnownLocale(tag: string): boolean {
  try {
    return Intl.DateTimeFormat.supportedLocalesOf([tag]).length > 0;
  } catch {
    return false; // not a language tag at all
  }
}

/** Fixes the locale (tests, or a user preference); null returns to the browser's language. */
export function setFormatLocale(locale: string | null): void {
  chosenLocale = locale;
  browserLocale = null;
  formatters.clear();
}

const formatters = new Map<string, Intl.DateTimeFormat | Intl.NumberFormat>();

function cached<T extends Intl.DateTimeFormat | Intl.NumberFormat>(key: string, make: (locale: string) => T): T {
  const locale = formatLocale();
  const id = `${locale}|${key}`;
  let formatter = formatters.get(id) as T | undefined;
  if (!formatter) {
    formatter = make(locale);
    formatters.set(id, formatter);
  }
  return formatter;
}

const DAY = { day: "numeric", month: "short", year: "numeric" } as const;
const CLOCK = { hour: "2-digit", minute: "2-digit" } as const;

function parse(iso: string): Date | null {
  // a calendar date alone ("2026-10-17") is that day, wherever the reader is
  const date = new Date(/^\d{4}-\d{2}-\d{2}$/.test(iso) ? `${iso}T00:00:00Z` : iso);
  return Number.isNaN(date.getTime()) ? null : date;
}

/** A calendar day as written: "17 Oct 2026" from "2026-10-17" or from a time stamp's date. */
export function formatDay(iso: string | null | undefined): string {
  if (!iso) return "–";
  const day = /^(\d{4}-\d{2}-\d{2})/.exec(iso)?.[1];
  const date = day ? parse(day) : null;
  return date ? cached("day", (l) => new Intl.DateTimeFormat(l, { ...DAY, timeZone: "UTC" })).format(date) : iso;
}

/** A calendar month as written: "Oct 2026" from "2026-10". */
export function formatMonth(month: string): string {
  const date = /^\d{4}-\d{2}$/.test(month) ? parse(`${month}-01`) : null;
  return date ? cached("month", (l) => new Intl.DateTimeFormat(l, { month: "short", year: "numeric", timeZone: "UTC" })).format(date) : month;
}

/** When something happened in Quarterbeat (an import, a send), in the reader's time zone: "2 Dec 2026, 15:20". */
export function formatDateTime(iso: string): string {
  const date = parse(iso);
  return date ? cached("when", (l) => new Intl.DateTimeFormat(l, { ...DAY, ...CLOCK })).format(date) : iso;
}

/** A time a device recorded, as recorded (UTC in the files): "30 Nov 2026, 09:24". */
export function formatRecordedDateTime(iso: string): string {
  const date = parse(iso);
  return date ? cached("recorded", (l) => new Intl.DateTimeFormat(l, { ...DAY, ...CLOCK, timeZone: "UTC" })).format(date) : iso;
}

/** The clock time a device recorded: "09:11". */
export function formatRecordedClock(iso: string): string {
  const date = parse(iso);
  return date ? cached("clock", (l) => new Intl.DateTimeFormat(l, { ...CLOCK, timeZone: "UTC" })).format(date) : iso;
}

/** A whole number with the locale's grouping: "12,345"; "–" when missing. */
export function formatCount(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  return cached("count", (l) => new Intl.NumberFormat(l, { maximumFractionDigits: 0 })).format(value);
}

/** A number with exactly `decimals` decimals in the locale's way: "36.7"; "–" when missing. */
export function formatDecimal(value: number | null | undefined, decimals: number): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return "–";
  return cached(`fixed${decimals}`, (l) => new Intl.NumberFormat(l, { minimumFractionDigits: decimals, maximumFractionDigits: decimals })).format(value);
}
