// Reads a CSV file or stream record by record with csv-parse's stream API, in bounded memory: one chunk of
// bytes and that chunk's records at a time. Hashes the bytes (sha-256, for the batch record) and counts them
// (for progress by bytes read) on the way. The separator (comma, semicolon or tab) is read off the header
// line before the parser starts.
import { createHash } from "node:crypto";
import fs from "node:fs";
import type { Readable } from "node:stream";
import { CsvError, parse, type Parser } from "csv-parse";
import { delimiterChars, detectDelimiter, headerLine, type Delimiter } from "../../shared/import/delimiter";

/** A file on disk, or a stream with the name to record (the demo seeder and the tests pass text). */
export type ImportInput = { path: string; fileName?: string } | { stream: Readable; fileName: string; size?: number };

export interface CsvProgress {
  bytesRead: number;
  totalBytes: number | null;
  rows: number;
}

export interface CsvHandlers {
  /** The header row; return false to stop reading (the header alone refuses the file). */
  header(fields: string[]): boolean;
  /** One data record; row 1 is the first record after the header. */
  record(fields: string[], row: number): void;
  /** After each chunk; awaited, so a caller may yield to the event loop or post progress. */
  chunk?(progress: CsvProgress): void | Promise<void>;
}

export interface CsvReadResult {
  sha256: string;
  bytesRead: number;
  rows: number;
  /** False when `header` asked to stop. */
  complete: boolean;
  /** The separator the header line shows; null when the file held no line at all. */
  delimiter: Delimiter | null;
}

/** The file is not readable CSV at this point (an unclosed quote, a record over the size limit, …). */
export class CsvSyntaxError extends Error {
  constructor(
    message: string,
    readonly row: number | null,
  ) {
    super(message);
    this.name = "CsvSyntaxError";
  }
}

const CHUNK_BYTES = 1 << 20;
const MAX_RECORD_CHARS = 1 << 20;

export function inputName(input: ImportInput): string {
  return "path" in input ? (input.fileName ?? input.path) : input.fileName;
}

export function inputSize(input: ImportInput): number | null {
  if ("path" in input) return fs.statSync(input.path).size;
  return input.size ?? null;
}

function openInput(input: ImportInput): Readable {
  return "path" in input ? fs.createReadStream(input.path, { highWaterMark: CHUNK_BYTES }) : input.stream;
}

export async function readCsv(input: ImportInput, handlers: CsvHandlers): Promise<CsvReadResult> {
  const totalBytes = inputSize(input);
  const source = openInput(input);
  const hash = createHash("sha256");
  let parser: Parser | null = null;
  let delimiter: Delimiter | null = null;
  // bytes held until the header line is complete, so its separator is known before parsing starts
  let head: Buffer[] = [];
  let headBytes = 0;
  let bytesRead = 0;
  let rows = 0;
  let headerSeen = false;
  let stopped = false;
  let failure: unknown;

  const start = (bytes: Buffer): Parser => {
    const line = headerLine(bytes.toString("utf8"));
    delimiter = line ? detectDelimiter(line.line) : null;
    const started = parse({
      bom: true,
      delimiter: delimiterChars[delimiter ?? "comma"],
      relax_column_count: true, // a short or long row is reported by the importer, row by row
      skip_empty_lines: true,
      max_record_size: MAX_RECORD_CHARS,
    });
    started.on("error", (err) => (failure = err));
    started.write(bytes);
    return started;
  };
  /** Writes a chunk, or holds it while the header line is still incomplete; null while held. */
  const write = (bytes: Buffer, atEnd: boolean): Parser | null => {
    if (parser) {
      if (bytes.length > 0) parser.write(bytes);
      return parser;
    }
    head.push(bytes);
    headBytes += bytes.length;
    const held = Buffer.concat(head);
    if (!atEnd && headBytes < MAX_RECORD_CHARS && !headerLine(held.toString("utf8"))?.complete) return null;
    head = [];
    return (parser = start(held));
  };

  const drain = () => {
    let record: string[] | null;
    while (parser && (record = parser.read() as string[] | null) !== null) {
      if (stopped) continue;
      if (!headerSeen) {
        // a line of spaces (or a stray \r) before the header is blank too; skip_empty_lines skips only empty ones
        if (record.length === 1 && record[0].trim() === "") continue;
        headerSeen = true;
        if (!handlers.header(record)) stopped = true;
      } else {
        rows++;
        handlers.record(record, rows);
      }
    }
  };
  const syntaxError = (err: unknown): never => {
    if (err instanceof CsvError) {
      throw new CsvSyntaxError(`The file is not readable as CSV near row ${rows + 1}: ${err.message}`, rows + 1);
    }
    throw err;
  };

  try {
    for await (const chunk of source) {
      const bytes = typeof chunk === "string" ? Buffer.from(chunk) : (chunk as Buffer);
      hash.update(bytes);
      bytesRead += bytes.length;
      if (!write(bytes, false)) continue;
      if (failure) syntaxError(failure);
      drain();
      if (failure) syntaxError(failure);
      if (stopped) break;
      await handlers.chunk?.({ bytesRead, totalBytes, rows });
    }
    if (!stopped) {
      const last = write(Buffer.alloc(0), true)!;
      if (failure) syntaxError(failure);
      drain();
      last.end();
      await new Promise<void>((resolve) => {
        if (last.readableEnded) return resolve();
        last.once("end", resolve);
        last.once("error", () => resolve());
        last.on("readable", drain);
        drain();
      });
      if (failure) syntaxError(failure);
    }
  } finally {
    source.destroy();
  }
  if (!headerSeen && !stopped) handlers.header([]);
  return { sha256: hash.digest("hex"), bytesRead, rows, complete: !stopped, delimiter };
}
