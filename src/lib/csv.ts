// CSV export for tables. Spreadsheet programs run a cell that starts with = + - @ (or a tab or carriage
// return that hides one) as a formula, so such cells get a leading single quote: the OWASP "CSV Injection"
// advice. Numbers stay numbers: a real negative number cannot carry a formula.

export type CsvValue = string | number | boolean | null | undefined | Date;

const formulaStart = /^[=+\-@\t\r]/;

/** Prefixes a single quote when a spreadsheet would read the text as a formula. */
export function neutraliseFormula(text: string): string {
  return formulaStart.test(text) ? `'${text}` : text;
}

/** Turns one value into one CSV field: neutralised, then quoted when it holds a comma, quote or line break. */
export function csvField(value: CsvValue): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  if (typeof value === "boolean") return value ? "yes" : "no";
  const text = neutraliseFormula(value instanceof Date ? value.toISOString() : value);
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/** A whole CSV document (RFC 4180: CRLF line ends), header row first. */
export function toCsv(header: readonly string[], rows: readonly (readonly CsvValue[])[]): string {
  return [header, ...rows].map((row) => row.map(csvField).join(",")).join("\r\n") + "\r\n";
}

/** Offers a CSV to the browser as a download. The byte-order mark lets spreadsheet programs read UTF-8. */
export function downloadCsv(fileName: string, csv: string): void {
  const blob = new Blob(["\uFEFF", csv], { type: "text/csv;charset=utf-8" });
  const url = URL.createObjectURL(blob);
  const link = document.createElement("a");
  link.href = url;
  link.download = fileName.endsWith(".csv") ? fileName : `${fileName}.csv`;
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 0);
}
