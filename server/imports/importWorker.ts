// Runs one import in a worker thread with its own database connection, so the web server's event loop and
// connection stay free: a transaction on the shared connection would swallow other requests' writes while
// it awaits the next chunk. Started by worker.mjs; talks to jobs.ts by messages.
import { parentPort, workerData } from "node:worker_threads";
import { openDatabase } from "../db/client";
import { importFile, type ImportFileOptions } from "./service";

export interface WorkerInput {
  dbFile: string;
  options: Omit<ImportFileOptions, "onProgress" | "pendingClasses" | "now"> & { now?: string };
}

export type WorkerMessage =
  | { type: "progress"; bytesRead: number; totalBytes: number | null; rows: number }
  | { type: "done"; summary: Awaited<ReturnType<typeof importFile>> }
  | { type: "failed"; message: string; status?: number; code?: string };

const input = workerData as WorkerInput;
const post = (message: WorkerMessage) => parentPort!.postMessage(message);

const db = openDatabase(input.dbFile, { migrate: false });
try {
  const summary = await importFile(db, {
    ...input.options,
    now: input.options.now ? new Date(input.options.now) : undefined,
    onProgress: (p) => post({ type: "progress", bytesRead: p.bytesRead, totalBytes: p.totalBytes, rows: p.rows }),
  });
  post({ type: "done", summary });
} catch (err) {
  const e = err as { message?: string; status?: number; code?: string };
  post({ type: "failed", message: e.message ?? String(err), status: e.status, code: e.code });
} finally {
  db.$client.close();
}
