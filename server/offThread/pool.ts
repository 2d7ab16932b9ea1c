// Sends the long insight answers to worker threads (answerWorker.ts) when the database is a file, so the
// event loop stays free for other requests while one is computed; a database in memory (tests) cannot be
// shared with a thread, so there the answer is computed in-process by the same function. Either way the
// answer is kept per state of the database (../cache.ts) and an AppError thrown while computing it reaches
// the client as it would in-process.
import os from "node:os";
import { Worker } from "node:worker_threads";
import type { Response } from "express";
import type { Db } from "../db/client";
import { AppError } from "../errors";
import { cached, cachedAsync, insightCacheEnabled } from "../insight/cache";
import { answerJson, type AnswerArgs, type AnswerName } from "./answers";
import type { AnswerReply, AnswerRequest } from "./answerWorker";

// From source the worker is TypeScript loaded through tsx (answerWorker.mjs); compiled, it is the bundle
// answerWorker.js beside the server's main.js in dist/server (scripts/build-server.mjs).
const workerUrl = new URL(import.meta.url.endsWith(".ts") ? "./answerWorker.mjs" : "./answerWorker.js", import.meta.url);

interface Pending {
  resolve: (json: string) => void;
  reject: (err: Error) => void;
}

class AnswerThread {
  private worker: Worker | null = null;
  private nextId = 1;
  private readonly pending = new Map<number, Pending>();

  /** Requests sent and not yet answered. */
  get waiting(): number {
    return this.pending.size;
  }

  run(request: Omit<AnswerRequest, "id">): Promise<string> {
    const id = this.nextId++;
    return new Promise<string>((resolve, reject) => {
      this.pending.set(id, { resolve, reject });
      this.ensureWorker().postMessage({ ...request, id } satisfies AnswerRequest);
    });
  }

  private ensureWorker(): Worker {
    if (this.worker) return this.worker;
    const worker = new Worker(workerUrl);
    worker.unref(); // an idle worker never keeps the process alive
    worker.on("message", (reply: AnswerReply) => {
      const pending = this.pending.get(reply.id);
      if (!pending) return;
      this.pending.delete(reply.id);
      if ("json" in reply) pending.resolve(reply.json);
      else if ("error" in reply) pending.reject(new AppError(reply.error.code, reply.error.status, reply.error.message, reply.error.details, reply.error.hint));
      else pending.reject(new Error(`The answer could not be computed: ${reply.crash}`));
    });
    const failAll = (message: string) => {
      this.worker = null;
      for (const [id, pending] of this.pending) {
        this.pending.delete(id);
        pending.reject(new Error(message));
      }
    };
    worker.on("error", (err) => failAll(`The answer worker stopped: ${err.message}`));
    worker.on("exit", (code) => failAll(`The answer worker exited with code ${code}.`));
    this.worker = worker;
    return worker;
  }

  async close(): Promise<void> {
    const worker = this.worker;
    this.worker = null;
    await worker?.terminate();
  }
}

/**
 * One worker per core (at most four): answers that arrive together are computed side by side, each worker on
 * its own read connection, instead of queueing behind one. A request goes to the worker with the least waiting.
 */
class AnswerPool {
  private readonly threads: AnswerThread[];

  constructor(size: number) {
    this.threads = Array.from({ length: size }, () => new AnswerThread());
  }

  run(request: Omit<AnswerRequest, "id">): Promise<string> {
    const idlest = this.threads.reduce((best, thread) => (thread.waiting < best.waiting ? thread : best));
    return idlest.run(request);
  }

  async close(): Promise<void> {
    await Promise.all(this.threads.map((thread) => thread.close()));
  }
}

const POOL_SIZE = Math.max(1, Math.min(4, os.availableParallelism()));
const threads = new WeakMap<Db, AnswerPool>();
let offThread = true;

/** Computes every answer in-process (a test comparing both ways, or a host without worker threads). */
export function setAnswersOffThread(on: boolean): void {
  offThread = on;
}

function threadFor(db: Db): AnswerPool | null {
  if (!offThread || db.$client.memory) return null;
  let pool = threads.get(db);
  if (!pool) {
    pool = new AnswerPool(POOL_SIZE);
    threads.set(db, pool);
  }
  return pool;
}

/** Stops the database's answer workers, if it has any (server shutdown, tests). */
export async function closeAnswerThread(db: Db): Promise<void> {
  await threads.get(db)?.close();
  threads.delete(db);
}

/** The answer's JSON text: from the cache, from the worker thread, or computed here when there is none. */
export function answerText<N extends AnswerName>(db: Db, key: string, name: N, args: AnswerArgs<N>): Promise<string> | string {
  const thread = threadFor(db);
  if (thread === null) return cached(db, key, () => answerJson(db, name, args));
  return cachedAsync(db, key, () => thread.run({ dbFile: db.$client.name, key, useCache: insightCacheEnabled(), name, args: [...args] }));
}

/** Sends the answer for `key` (see answerText). */
export async function sendAnswer<N extends AnswerName>(db: Db, res: Response, key: string, name: N, args: AnswerArgs<N>): Promise<void> {
  res.type("application/json").send(await answerText(db, key, name, args));
}
