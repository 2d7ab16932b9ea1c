import Database from "better-sqlite3";

/** True while another connection holds the file's write lock (an import's BEGIN IMMEDIATE); waits for nobody. */
export function writeLockHeld(file: string): boolean {
  const probe = new Database(file, { timeout: 0, fileMustExist: true });
  try {
    probe.exec("BEGIN IMMEDIATE");
    probe.exec("ROLLBACK");
    return false;
  } catch (err) {
    if ((err as { code?: string }).code === "SQLITE_BUSY") return true;
    throw err;
  } finally {
    probe.close();
  }
}
