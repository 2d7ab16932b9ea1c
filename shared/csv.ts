// CSV for files the server writes (report figures). A spreadsheet runs a cell that starts with = + - @, or
// with a tab or carriage return hiding one, as a formula; such text cells get a leading single quote, as
// OWASP's "CSV Injection" page advises. Numbers are written as numbers: a real number cannot hold a formula.
// Output follows RFC 4180: comma separated, CRLF line ends, fields quoted when they hold , " or a line break.

export type CsvCell = string | number | boolean | null | undefined;

const FORMULA_START = /^[=+\-@\t\r]/;

export function neutraliseFormula(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

export function csvCell(value: CsvCell): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  if (typeof value === "boolean") return value ? "yes" : "no";
  const text = neutraliseFormula(value);
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

export function toCsv(header: readonly string[], rows: readonly (readonly CsvCell[])[]): string {
  return [header, ...rows].map((row) => row.map(csvCell).join(",")).join("\r\n") + "\r\n";
}
