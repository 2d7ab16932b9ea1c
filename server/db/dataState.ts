// The state of the stored data as one token: it changes whenever something is committed that a figure could
// depend on, and not otherwise. SQLite's data_version changes when another connection (a CLI import, the
// import worker thread) commits; total_changes() counts the rows this connection has written. Writes that no
// figure reads (sessions expiring or being extended) are counted aside and left out, so signing in neither
// empties the insight cache nor tells open pages to refetch.
import type Database from "better-sqlite3";
import type { Statement } from "better-sqlite3";

interface StateReader {
  readDataVersion: Statement;
  readChanges: Statement;
  housekeepingChanges: number;
}

const readers = new WeakMap<Database.Database, StateReader>();

function readerFor(sqlite: Database.Database): StateReader {
  let reader = readers.get(sqlite);
  if (!reader) {
    reader = {
      readDataVersion: sqlite.prepare("PRAGMA data_version").pluck(),
      readChanges: sqlite.prepare("SELECT total_changes()").pluck(),
      housekeepingChanges: 0,
    };
    readers.set(sqlite, reader);
  }
  return reader;
}

/** Records rows written on this connection that no figure reads (the session table). */
export function noteHousekeepingWrite(sqlite: Database.Database, info: Database.RunResult): void {
  readerFor(sqlite).housekeepingChanges += info.changes;
}

/** A token for the present state of the data as this connection sees it. */
export function dataState(sqlite: Database.Database): string {
  const reader = readerFor(sqlite);
  return `${reader.readDataVersion.get()}:${(reader.readChanges.get() as number) - reader.housekeepingChanges}`;
}
