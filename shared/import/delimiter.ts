// Which character separates the columns of an import file. Spreadsheets save "CSV" with commas, with
// semicolons where the comma is the decimal mark, or with tabs; the header row tells them apart, since
// column names never contain any of them unquoted.
import { z } from "zod";

export const delimiterSchema = z.enum(["comma", "semicolon", "tab"]);
export type Delimiter = z.infer<typeof delimiterSchema>;

export const delimiterChars: Record<Delimiter, string> = { comma: ",", semicolon: ";", tab: "\t" };

/** How an import result names the separator: "Columns separated by semicolons". */
export const delimiterLabels: Record<Delimiter, string> = { comma: "commas", semicolon: "semicolons", tab: "tabs" };

/** The first line that holds anything but blanks, and whether it is complete (ends before the text does). */
export function headerLine(text: string): { line: string; complete: boolean } | null {
  const body = text.replace(/^\uFEFF/, "");
  let start = 0;
  for (;;) {
    const end = body.indexOf("\n", start);
    const line = body.slice(start, end < 0 ? undefined : end).replace(/\r$/, "");
    if (line.trim() !== "") return { line, complete: end >= 0 };
    if (end < 0) return null;
    start = end + 1;
  }
}

/** The separator used most often outside quotes in the header line; commas when there is none or a tie. */
export function detectDelimiter(header: string): Delimiter {
  const counts: Record<Delimiter, number> = { comma: 0, semicolon: 0, tab: 0 };
  let quoted = false;
  for (const char of header) {
    if (char === '"') quoted = !quoted;
    else if (!quoted) {
      if (char === ",") counts.comma++;
      else if (char === ";") counts.semicolon++;
      else if (char === "\t") counts.tab++;
    }
  }
  let best: Delimiter = "comma";
  for (const candidate of ["semicolon", "tab"] as const) if (counts[candidate] > counts[best]) best = candidate;
  return best;
}
