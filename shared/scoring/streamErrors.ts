// Errors raised while reading a compression stream. Each names the entry (0-based position in the arrays or
// rows handed to the analysis) so an importer can point at the file row and column.

export type StreamField = "t_ms" | "depth_mm" | "release_mm";

export class StreamDataError extends Error {
  /** 0-based position of the offending entry in the input. */
  readonly index: number;
  constructor(message: string, index: number) {
    super(message);
    this.name = "StreamDataError";
    this.index = index;
  }
}

/** Two compressions at the same time: the stream cannot say which came first or how long the interval was. */
export class DuplicateTimestampError extends StreamDataError {
  readonly tMs: number;
  readonly otherIndex: number;
  constructor(tMs: number, firstIndex: number, secondIndex: number) {
    super(
      `Two compressions have the same time t_ms = ${tMs} (entries ${firstIndex} and ${secondIndex}, counting from 0); ` + "each compression needs its own time",
      secondIndex,
    );
    this.name = "DuplicateTimestampError";
    this.tMs = tMs;
    this.otherIndex = firstIndex;
  }
}

/** The fast core expects rows sorted by time; the row wrapper sorts for you. */
export class UnsortedTimestampError extends StreamDataError {
  readonly tMs: number;
  readonly previousTMs: number;
  constructor(tMs: number, previousTMs: number, index: number) {
    super(`Compression times must increase: t_ms = ${tMs} at entry ${index} (counting from 0) follows t_ms = ${previousTMs}`, index);
    this.name = "UnsortedTimestampError";
    this.tMs = tMs;
    this.previousTMs = previousTMs;
  }
}

export class InvalidStreamValueError extends StreamDataError {
  readonly field: StreamField;
  readonly value: unknown;
  constructor(field: StreamField, value: unknown, index: number, reason: string) {
    super(`${field} at entry ${index} (counting from 0) ${reason}; got ${describe(value)}`, index);
    this.name = "InvalidStreamValueError";
    this.field = field;
    this.value = value;
  }
}

function describe(value: unknown): string {
  if (typeof value === "string") return JSON.stringify(value);
  return String(value);
}
