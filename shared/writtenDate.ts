// Dates inside sentences the server writes (reasons on the equipment page and in alert mails, the funder
// report's PDF): "1 October 2025", the same for every reader, instead of an ISO date in running text.
const longDate = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" });

/** A calendar date (YYYY-MM-DD) or an instant, written out; text that is not a date comes back unchanged. */
export function writtenDate(value: string | Date): string {
  const date = typeof value === "string" ? new Date(/^\d{4}-\d{2}-\d{2}$/.test(value) ? `${value}T00:00:00Z` : value) : value;
  return Number.isNaN(date.getTime()) ? String(value) : longDate.format(date);
}
