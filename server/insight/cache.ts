// Answers of the insight routes, kept until the database changes. Network statistics over a million attempts
// take from a few hundred milliseconds to seconds to compute, while the data changes only when something is
// imported, rescored or edited; so each answer is computed once per state of the database.
//
// The state is read cheaply on every request: SQLite's data_version changes when another connection (a CLI
// import) commits, and total_changes() counts every row this connection has written. Any write therefore
// empties the cache; nothing is ever served from before it.
import type { Statement } from "better-sqlite3";
import type { Db } from "../db/client";

const MAX_ENTRIES = 500;

interface Store {
  version: string;
  entries: Map<string, unknown>;
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
    store = { version: "", entries: new Map(), readChanges: db.$client.prepare("SELECT total_changes()").pluck() };
    stores.set(db, store);
  }
  return store;
}

function databaseState(db: Db, store: Store): string {
  return `${db.$client.pragma("data_version", { simple: true })}:${store.readChanges.get()}`;
}

/** The answer for `key` in the database's present state, computing it when there is none yet. */
export function cached<T>(db: Db, key: string, compute: () => T): T {
  if (!enabled) return compute();
  const store = storeFor(db);
  const version = databaseState(db, store);
  if (version !== store.version) {
    store.version = version;
    store.entries.clear();
  }
  if (store.entries.has(key)) return store.entries.get(key) as T;
  const value = compute();
  // the computation may have written (the policy's first version); key it to the state after that
  const after = databaseState(db, store);
  if (after !== store.version) {
    store.version = after;
    store.entries.clear();
  }
  if (store.entries.size >= MAX_ENTRIES) store.entries.delete(store.entries.keys().next().value as string);
  store.entries.set(key, value);
  return value;
}
