// Answers of the insight routes, kept until the database changes. Network statistics over a million attempts
// take from a few hundred milliseconds to seconds to compute, while the data changes only when something is
// imported, rescored or edited; so each answer is computed once per state of the database.
//
// The state is read cheaply on every request: SQLite's data_version changes when another connection (a CLI
// import, the import worker thread) commits, and total_changes() counts every row this connection has
// written. Any write therefore empties the cache; nothing is ever served from before it.
import type { Statement } from "better-sqlite3";
import type { Response } from "express";
import type { Db } from "../db/client";

const MAX_ENTRIES = 500;

interface Store {
  version: string;
  entries: Map<string, unknown>;
  readDataVersion: Statement;
  readChanges: Statement;
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
    store = {
      version: "",
      entries: new Map(),
      readDataVersion: db.$client.prepare("PRAGMA data_version").pluck(),
      readChanges: db.$client.prepare("SELECT total_changes()").pluck(),
    };
    stores.set(db, store);
  }
  return store;
}

function databaseState(store: Store): string {
  return `${store.readDataVersion.get()}:${store.readChanges.get()}`;
}

/**
 * The answer for `key` in the database's present state, computing it when there is none yet. The computation
 * reads one snapshot (a read transaction), and its answer is kept only if nothing was written meanwhile.
 */
export function cached<T>(db: Db, key: string, compute: () => T): T {
  if (!enabled) return compute();
  const store = storeFor(db);
  const before = databaseState(store);
  if (before !== store.version) {
    store.version = before;
    store.entries.clear();
  }
  if (store.entries.has(key)) return store.entries.get(key) as T;
  const sqlite = db.$client;
  const value = sqlite.inTransaction ? compute() : sqlite.transaction(compute).deferred();
  if (databaseState(store) === before) {
    if (store.entries.size >= MAX_ENTRIES) store.entries.delete(store.entries.keys().next().value as string);
    store.entries.set(key, value);
  }
  return value;
}

/** Sends the answer for `key`, computed and serialised once per state of the database. */
export function sendCached(db: Db, res: Response, key: string, compute: () => unknown): void {
  res.type("application/json").send(cached(db, key, () => JSON.stringify(compute())));
}
