// Finds Quarterbeat's columns in a file's header row, through the mapping's renames.
import type { ImportKind } from "../domain";
import { importColumns } from "./columns";
import type { ImportMapping } from "./mapping";

export interface HeaderProblem {
  column: string;
  reason: string;
}

export interface ResolvedHeader {
  /** Quarterbeat column → position in the row, -1 when absent (optional columns). */
  index: Record<string, number>;
  /** Missing required columns and other header faults; any of these refuses the file before any row. */
  problems: HeaderProblem[];
  /** Columns of the file that no Quarterbeat column reads (ignored, with a warning). */
  extra: string[];
}

const normalise = (name: string) => name.trim().toLowerCase();

export function resolveHeader(header: readonly string[], kind: ImportKind, mapping: ImportMapping): ResolvedHeader {
  const positions = new Map<string, number>();
  const problems: HeaderProblem[] = [];
  header.forEach((name, i) => {
    const key = normalise(name);
    if (key === "") return;
    if (positions.has(key)) problems.push({ column: name.trim(), reason: `the header names the column "${name.trim()}" twice` });
    else positions.set(key, i);
  });

  const index: Record<string, number> = {};
  const used = new Set<number>();
  for (const spec of importColumns[kind]) {
    const source = mapping.columns[spec.name] ?? spec.name;
    const position = positions.get(normalise(source));
    if (position === undefined) {
      index[spec.name] = -1;
      if (spec.required) {
        const via = source === spec.name ? "" : ` (mapped from "${source}")`;
        problems.push({ column: spec.name, reason: `required column "${spec.name}"${via} is missing from the header` });
      }
    } else {
      index[spec.name] = position;
      used.add(position);
    }
  }
  for (const known of Object.keys(mapping.columns)) {
    if (!Object.hasOwn(index, known)) problems.push({ column: known, reason: `the mapping names "${known}", which is not a column of ${kind} files` });
  }
  const extra = header
    .map((name, i) => ({ name: name.trim(), i }))
    .filter(({ name, i }) => name !== "" && !used.has(i))
    .map(({ name }) => name);
  return { index, problems, extra };
}
