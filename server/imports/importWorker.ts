// Runs imports in a worker thread with its own database connection, so the web server's event loop and
// connection stay free: a transaction on the shared connection would swallow other requests' writes while
// it awaits the next chunk. Started once by jobs.ts (through worker.mjs); takes one job at a time by message.
import { parentPort } from "node:worker_threads";
import { openDatabase } from "../db/client";
import { recordJobDone } from "./records";
import { importFile, type ImportFileOptions } from "./service";

export interface WorkerInput {
  jobId: string;
  dbFile: string;
  options: Omit<ImportFileOptions, "onProgress" | "pendingClasses" | "now"> & { now?: string };
}

export type WorkerMessage = { jobId: string } & (
  | { type: "progress"; bytesRead: number; totalBytes: number | null; rows: number }
  | { type: "done"; summary: Awaited<ReturnType<typeof importFile>> }
  | { type: "failed"; message: string }
);

const port = parentPort!;
const post = (message: WorkerMessage) => port.postMessage(message);

port.on("message", async (input: WorkerInput) => {
  const { jobId } = input;
  let db: ReturnType<typeof openDatabase> | undefined;
  try {
    db = openDatabase(input.dbFile, { migrate: false });
    const summary = await importFile(db, {
      ...input.options,
      now: input.options.now ? new Date(input.options.now) : undefined,
      onProgress: (p) => post({ jobId, type: "progress", bytesRead: p.bytesRead, totalBytes: p.totalBytes, rows: p.rows }),
    });
    try {
      recordJobDone(db, jobId, summary);
    } catch {
      // the server writes the same state itself; the import is stored either way
    }
    post({ jobId, type: "done", summary });
  } catch (err) {
    post({ jobId, type: "failed", message: err instanceof Error ? err.message : String(err) });
  } finally {
    db?.$client.close();
  }
});
