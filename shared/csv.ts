// The one CSV writer: report figures, table downloads, refused-row downloads and the demo import files.
// Output follows RFC 4180: comma separated, CRLF line ends, a field quoted when it holds a comma, a quote or a
// line break (quotes doubled); fields with leading or trailing spaces are quoted too, so no reader trims them.
//
// A spreadsheet runs a cell that starts with = + - @, or with a tab or carriage return hiding one, as a
// formula. Files meant for spreadsheets give such text a leading single quote, as OWASP's "CSV Injection"
// page advises; text that is a plain number ("-0.5") is left alone, since a spreadsheet reads it as a
// number. Files Quarterbeat reads back itself (the demo import files) keep their text exactly: the importer
// would store the quote as part of the value.

export type CsvCell = string | number | boolean | Date | null | undefined;

export interface CsvOptions {
  /** true for files a person opens in a spreadsheet; false for files only Quarterbeat's importer reads. */
  guardFormulas: boolean;
}

/** Exports people open in a spreadsheet: report figures, table downloads, refused rows. */
export const SPREADSHEET_CSV: CsvOptions = { guardFormulas: true };
/** Files only Quarterbeat's importer reads back (the demo import files): text is kept exactly. */
export const IMPORT_FILE_CSV: CsvOptions = { guardFormulas: false };

export const CSV_LINE_END = "\r\n";

const FORMULA_START = /^[=+\-@\t\r]/;
const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const NEEDS_QUOTES = /[",\r\n]|^\s|\s$/;

/** Prefixes a single quote when a spreadsheet would run the text as a formula. */
export function neutraliseFormula(text: string): string {
  return FORMULA_START.test(text) && !PLAIN_NUMBER.test(text) ? `'${text}` : text;
}

/** One value as one field. Numbers are written as numbers (a real number cannot hold a formula). */
export function csvField(value: CsvCell, options: CsvOptions): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  if (typeof value === "boolean") return value ? "yes" : "no";
  const raw = value instanceof Date ? value.toISOString() : value;
  const text = options.guardFormulas ? neutraliseFormula(raw) : raw;
  return NEEDS_QUOTES.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/** One record's fields joined by commas, without its line end (for callers that append fields). */
export function csvRecord(values: readonly CsvCell[], options: CsvOptions): string {
  return values.map((value) => csvField(value, options)).join(",");
}

/** One record with its line end, for files written or streamed a line at a time. */
export function csvLine(values: readonly CsvCell[], options: CsvOptions): string {
  return csvRecord(values, options) + CSV_LINE_END;
}

/** A whole CSV document, header first. Every row must have as many fields as the header. */
export function toCsv(header: readonly string[], rows: Iterable<readonly CsvCell[]>, options: CsvOptions): string {
  const lines = [csvLine(header, options)];
  for (const row of rows) {
    if (row.length !== header.length) {
      throw new RangeError(`CSV row ${lines.length + 1} has ${row.length} fields, the header has ${header.length}`);
    }
    lines.push(csvLine(row, options));
  }
  return lines.join("");
}
