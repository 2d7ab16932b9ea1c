// Minimal CSV writing (RFC 4180): comma-separated, a header row, fields quoted only when they hold a comma,
// quote or line break, "\n" line ends and a final line end.

export type CsvValue = string | number | null;

export function toCsv(header: readonly string[], rows: Iterable<readonly CsvValue[]>): string {
  const lines = [csvLine(header)];
  for (const row of rows) {
    if (row.length !== header.length) {
      throw new Error(`CSV row has ${row.length} fields, the header has ${header.length}`);
    }
    lines.push(csvLine(row));
  }
  return joinLines(lines);
}

/** One record without its line end. */
export function csvLine(values: readonly CsvValue[]): string {
  return values.map(field).join(",");
}

/** Records (already written with csvLine) as file text with a final line end. */
export function joinLines(lines: readonly string[]): string {
  return `${lines.join("\n")}\n`;
}

function field(value: CsvValue): string {
  if (value === null) return "";
  if (typeof value === "number") return String(value);
  const text = value;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}
