// Computes insight answers in a worker thread with its own read connection, so a long answer (My standing
// over many quarters on a large network) never holds the web server's event loop. Started by pool.ts; takes
// one request at a time by message and answers with the JSON text or the error to send.
import { parentPort } from "node:worker_threads";
import { openDatabase, type Db } from "../db/client";
import { AppError } from "../errors";
import { cached, setInsightCache } from "../insight/cache";
import { answerJson, type AnswerArgs, type AnswerName } from "./answers";

export interface AnswerRequest {
  id: number;
  dbFile: string;
  /** The cache key of the answer: the worker keeps its own answers per state of the database too. */
  key: string;
  /** False when the server's own cache is off (the benchmark measures uncached answers). */
  useCache: boolean;
  name: AnswerName;
  args: unknown[];
}

export type AnswerReply =
  | { id: number; json: string }
  | { id: number; error: { code: string; status: number; message: string; details?: unknown; hint?: string } }
  | { id: number; crash: string };

const port = parentPort!;
/** SQLite's largest memory map on common builds (SQLITE_MAX_MMAP_SIZE): pages beyond it are read as usual. */
const READ_MAP_BYTES = 0x7fff0000;
const connections = new Map<string, Db>();

function connectionTo(file: string): Db {
  let db = connections.get(file);
  if (!db) {
    db = openDatabase(file, { migrate: false });
    // this connection only reads: memory-mapped pages spare a copy per page read (the packed per-instructor rows
    // are several pages each), about half the time of reading them over a range of quarters
    db.$client.pragma(`mmap_size = ${READ_MAP_BYTES}`);
    connections.set(file, db);
  }
  return db;
}

port.on("message", (request: AnswerRequest) => {
  let reply: AnswerReply;
  try {
    // the answers also keep parts they share in the cache (standing's network figures): on or off as the server's
    setInsightCache(request.useCache);
    const db = connectionTo(request.dbFile);
    const compute = () => answerJson(db, request.name, request.args as AnswerArgs<AnswerName>);
    reply = { id: request.id, json: cached(db, request.key, compute) };
  } catch (err) {
    reply =
      err instanceof AppError
        ? { id: request.id, error: { code: err.code, status: err.status, message: err.message, details: err.details, hint: err.hint } }
        : { id: request.id, crash: err instanceof Error ? (err.stack ?? err.message) : String(err) };
  }
  port.postMessage(reply);
});
