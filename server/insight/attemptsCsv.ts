// Every attempt a search selects as CSV, in the search's order: the whole result, not one page. A whole
// quarter is tens of thousands of rows, too many to read and write in one go without holding the server's
// event loop, so the export reads on a connection of its own inside one read transaction (a file never
// mixes rows from before and after an import): the ids in the search's order once, then the rows a chunk of
// ids at a time, giving the loop back between chunks and waiting while the client is slow to take them.
// Lengths are in millimetres (the unit the figures are stored in); cells are written by shared/csv.
import { csvLine, SPREADSHEET_CSV, type CsvCell } from "../../shared/csv";
import type { AttemptRow } from "../../shared/schemas/insight";
import { attemptFieldNames, errorLabels, feedbackNames, patientTypeNames, resultNames } from "../../shared/vocabulary";
import { inArray } from "drizzle-orm";
import { openDatabase } from "../db/client";
import { attempts } from "../db/schema";
import { selectRowIds, selectRows, toRow } from "./attempts";
import { attemptOrder, attemptSearchConditions, type AttemptSearch } from "./attemptSearch";
import type { ResolvedFilters } from "./filters";

/** Rows per chunk: small enough that reading and writing one holds the event loop well under 100 ms. */
const CHUNK_ROWS = 500;

const words = attemptFieldNames;

const columns: readonly [string, (a: AttemptRow) => CsvCell][] = [
  [words.id, (a) => a.id],
  [words.startedAt, (a) => a.startedAt],
  [words.quarter, (a) => a.quarter],
  [words.class, (a) => a.classId],
  [words.learner, (a) => a.learner],
  [words.site, (a) => a.site?.code],
  [words.instructor, (a) => a.instructor?.code],
  [words.manikin, (a) => a.manikin?.assetId],
  [words.profile, (a) => patientTypeNames[a.profile]],
  [words.feedback, (a) => feedbackNames[a.feedback]],
  [words.score, (a) => a.score],
  [words.passed, (a) => (a.passed ? resultNames.passed : resultNames.notPassed)],
  [words.instructorResult, (a) => (a.instructorResult === null ? null : a.instructorResult === "pass" ? resultNames.passed : resultNames.notPassed)],
  [words.errors, (a) => a.errors.map((e) => errorLabels[e]).join("; ")],
  [words.compressions, (a) => a.metrics.compressions],
  [words.duration, (a) => a.metrics.durationS],
  [`${words.depth} (mm)`, (a) => a.metrics.depthMm],
  [words.depthOk, (a) => a.metrics.depthOkPct],
  [words.tooShallow, (a) => a.metrics.tooShallowPct],
  [words.tooDeep, (a) => a.metrics.tooDeepPct],
  [words.rate, (a) => a.metrics.rateCpm],
  [words.rateOk, (a) => a.metrics.rateOkPct],
  [words.tooSlow, (a) => a.metrics.tooSlowPct],
  [words.tooFast, (a) => a.metrics.tooFastPct],
  [words.recoilOk, (a) => a.metrics.recoilOkPct],
  [words.handsOn, (a) => a.metrics.handsOnPct],
  [words.longestPause, (a) => a.metrics.longestPauseS],
  [words.stream, (a) => a.hasStream],
  [words.policyVersion, (a) => a.policyVersion],
];

/** A spreadsheet file: text that a spreadsheet would run as a formula is neutralised. */
function line(cells: readonly CsvCell[]): string {
  return csvLine(cells, SPREADSHEET_CSV);
}

/** Where the file goes: `write` answers false when the reader has enough for now; `drained` waits until more is wanted. */
export interface CsvSink {
  write(text: string): boolean;
  drained(): Promise<void>;
  /** The reader went away: stop reading. */
  closed(): boolean;
}

const nextTurn = () => new Promise<void>((resolve) => setImmediate(resolve));

/** Writes the header, then the rows a chunk at a time; answers the number of rows written. */
export async function writeAttemptsCsv(dbFile: string, filters: ResolvedFilters, search: AttemptSearch, sink: CsvSink): Promise<number> {
  const reader = openDatabase(dbFile, { migrate: false });
  try {
    reader.$client.exec("BEGIN"); // the snapshot every chunk reads
    const where = attemptSearchConditions(filters, search);
    const ids = selectRowIds(reader, where)
      .orderBy(...attemptOrder(search))
      .all()
      .map((row) => row.id);
    sink.write(line(columns.map(([header]) => header)));
    let written = 0;
    while (written < ids.length && !sink.closed()) {
      const chunk = ids.slice(written, written + CHUNK_ROWS);
      const byId = new Map(
        selectRows(reader, inArray(attempts.id, chunk))
          .all()
          .map((row) => [row.attempt.id, toRow(row)]),
      );
      const text = chunk.map((id) => line(columns.map(([, value]) => value(byId.get(id)!)))).join("");
      written += chunk.length;
      if (!sink.write(text)) await sink.drained();
      else await nextTurn();
    }
    return written;
  } finally {
    if (reader.$client.inTransaction) reader.$client.exec("COMMIT");
    reader.$client.close();
  }
}

/** "attempts-2026-Q2.csv", or "attempts-2025-Q3-to-2026-Q2.csv" for a range. */
export function attemptsCsvFileName(filters: ResolvedFilters): string {
  const { from, to } = filters.period;
  return from === to ? `attempts-${from}.csv` : `attempts-${from}-to-${to}.csv`;
}
