// Every attempt a search selects as CSV, in the search's order: the whole result, not one page. The rows are
// read in chunks inside one read transaction, so a file never mixes rows from before and after an import.
// Lengths are in millimetres (the unit the figures are stored in); cells are written by shared/csv.
import { csvLine, SPREADSHEET_CSV, type CsvCell } from "../../shared/csv";
import type { AttemptRow } from "../../shared/schemas/insight";
import { attemptFieldNames, errorLabels, feedbackNames, patientTypeNames, resultNames } from "../../shared/vocabulary";
import type { Db } from "../db/client";
import { selectRows, toRow } from "./attempts";
import { attemptOrder, attemptSearchConditions, type AttemptSearch } from "./attemptSearch";
import type { ResolvedFilters } from "./filters";

const CHUNK_ROWS = 1000;

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

/** Hands `write` the header, then the rows a chunk at a time; answers the number of rows written. */
export function writeAttemptsCsv(db: Db, filters: ResolvedFilters, search: AttemptSearch, write: (text: string) => void): number {
  const where = attemptSearchConditions(filters, search);
  const order = attemptOrder(search);
  return db.$client
    .transaction(() => {
      write(line(columns.map(([header]) => header)));
      let written = 0;
      for (;;) {
        const rows = selectRows(db, where).orderBy(...order).limit(CHUNK_ROWS).offset(written).all();
        if (rows.length > 0) write(rows.map(toRow).map((attempt) => line(columns.map(([, value]) => value(attempt)))).join(""));
        written += rows.length;
        if (rows.length < CHUNK_ROWS) return written;
      }
    })
    .deferred();
}

/** "attempts-2026-Q2.csv", or "attempts-2025-Q3-to-2026-Q2.csv" for a range. */
export function attemptsCsvFileName(filters: ResolvedFilters): string {
  const { from, to } = filters.period;
  return from === to ? `attempts-${from}.csv` : `attempts-${from}-to-${to}.csv`;
}
