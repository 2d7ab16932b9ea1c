// What every kind's importer offers the service: one call per file row, one at the end of the file.
export interface KindImporter {
  /** A data row; `fields` are the record's raw values, row 1 = first data row after the header. */
  row(fields: string[], row: number): void;
  /** After the last row (compression streams are analysed here). */
  finish(): void;
  /** Once the file is accepted, before its transaction commits: writes rows held back until then. */
  beforeCommit?(): void;
  /** What inserted/updated/unchanged count: file rows, or attempts for compression streams. */
  readonly unit: "rows" | "attempts";
}
