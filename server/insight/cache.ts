// Answers of the insight routes, kept until the database changes. Network statistics over a million attempts
// take from a few hundred milliseconds to seconds to compute, while the data changes only when something is
// imported, rescored or edited; so each answer is computed once per state of the database.
//
// The state is read cheaply on every request (see db/dataState): any write a figure could depend on empties
// the cache, from this process or another; nothing is ever served from before it.
import { randomUUID } from "node:crypto";
import type { Response } from "express";
import type { Db } from "../db/client";
import { dataState } from "../db/dataState";

const MAX_ENTRIES = 500;
/** Tells this process's database states apart from those of an earlier run, whose counters started alike. */
const PROCESS_RUN = randomUUID().slice(0, 8);

interface Store {
  version: string;
  entries: Map<string, unknown>;
}

const stores = new WeakMap<Db, Store>();
let enabled = true;

/** Turns the cache off or on (the benchmark measures the uncached cost with it off). */
export function setInsightCache(on: boolean): void {
  enabled = on;
}

function storeFor(db: Db): Store {
  let store = stores.get(db);
  if (!store) {
    store = { version: "", entries: new Map() };
    stores.set(db, store);
  }
  return store;
}

/**
 * An opaque token for the database's present state, as the cache sees it. Clients compare it with the one
 * they saw last: when it differs, figures may have changed (an import from the CLI, say) and they refetch.
 */
export function dataVersion(db: Db): string {
  return `${PROCESS_RUN}:${dataState(db.$client)}`;
}

/**
 * The answer for `key` in the database's present state, computing it when there is none yet. The computation
 * reads one snapshot (a read transaction), and its answer is kept only if nothing was written meanwhile.
 */
export function cached<T>(db: Db, key: string, compute: () => T): T {
  if (!enabled) return compute();
  const { store, before } = currentStore(db);
  if (store.entries.has(key)) return store.entries.get(key) as T;
  const sqlite = db.$client;
  const value = sqlite.inTransaction ? compute() : sqlite.transaction(compute).deferred();
  keepIfUnchanged(db, store, before, key, value);
  return value;
}

/** The cache of the database's present state (emptied when the state moved on since it was last read). */
function currentStore(db: Db): { store: Store; before: string } {
  const store = storeFor(db);
  const before = dataState(db.$client);
  if (before !== store.version) {
    store.version = before;
    store.entries.clear();
  }
  return { store, before };
}

/** Keeps an answer only if nothing was written while it was computed, so it is never served for another state. */
function keepIfUnchanged(db: Db, store: Store, before: string, key: string, value: unknown): void {
  if (dataState(db.$client) !== before || store.version !== before) return;
  if (store.entries.size >= MAX_ENTRIES) store.entries.delete(store.entries.keys().next().value as string);
  store.entries.set(key, value);
}

export function insightCacheEnabled(): boolean {
  return enabled;
}

/**
 * As `cached`, for an answer computed elsewhere (a worker thread reading its own snapshot): kept only if the
 * database was not written while it was computed, so it is never served for a state it was not computed in.
 */
export async function cachedAsync(db: Db, key: string, compute: () => Promise<string>): Promise<string> {
  if (!enabled) return compute();
  const { store, before } = currentStore(db);
  if (store.entries.has(key)) return store.entries.get(key) as string;
  const value = await compute();
  keepIfUnchanged(db, store, before, key, value);
  return value;
}

/** Sends the answer for `key`, computed and serialised once per state of the database. */
export function sendCached(db: Db, res: Response, key: string, compute: () => unknown): void {
  res.type("application/json").send(cached(db, key, () => JSON.stringify(compute())));
}
