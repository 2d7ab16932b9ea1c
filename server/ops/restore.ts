// Restores a backup into a new or stopped database file: the backup is checked first, copied with SQLite's
// backup API beside the target, checked again, and only then moved into place in one rename.
import fs from "node:fs";
import path from "node:path";
import { writeLockHeld } from "../db/writeLock";
import { AppError } from "../errors";
import { checkQuarterbeatDatabase, readCopy, type DatabaseCheck } from "./databaseCheck";
import { inUseError, lockFileOf, serverHolding } from "./serverLock";

export interface RestoreRequest {
  backupFile: string;
  targetFile: string;
  /** Replace an existing target database. Never overrides a running server's lock. */
  force?: boolean;
}

export interface RestoreResult extends DatabaseCheck {
  backupFile: string;
  targetFile: string;
  replaced: boolean;
}

const refused = (message: string, hint: string) => new AppError("restore_refused", 409, message, undefined, hint);

function refuseUnsafeTarget(target: string, force: boolean) {
  const holder = serverHolding(target);
  if (holder) throw inUseError(target, holder);
  if (!fs.existsSync(target)) return;
  if (!force) {
    throw refused(`${target} already exists.`, "Restore into a new file with --db, or add --force to replace it (its current contents are lost).");
  }
  if (writeLockHeld(target)) {
    throw refused(`${target} is being written by another process (an import?).`, "Wait for it to finish, stop it, and try again.");
  }
}

export async function restoreDatabase(request: RestoreRequest): Promise<RestoreResult> {
  const backupFile = path.resolve(request.backupFile);
  const targetFile = path.resolve(request.targetFile);
  if (backupFile === targetFile) {
    throw refused("The backup and the target database are the same file.", "Give the database to restore into with --db.");
  }
  await checkQuarterbeatDatabase(backupFile);
  refuseUnsafeTarget(targetFile, request.force ?? false);

  fs.mkdirSync(path.dirname(targetFile), { recursive: true });
  const staging = `${targetFile}.restoring-${process.pid}`;
  fs.rmSync(staging, { force: true });
  await readCopy(backupFile, (source) => source.backup(staging));
  const removeStaging = () => fs.rmSync(staging, { force: true });
  let check: DatabaseCheck;
  try {
    check = await checkQuarterbeatDatabase(staging);
  } catch (err) {
    removeStaging();
    throw err;
  }
  // checked again just before the swap: a server may have started while the copy was written
  const holder = serverHolding(targetFile);
  if (holder) {
    removeStaging();
    throw inUseError(targetFile, holder);
  }
  const replaced = fs.existsSync(targetFile);
  // A write-ahead log or shared-memory file left by the old database would be replayed onto the restored one.
  for (const sidecar of ["-wal", "-shm", "-journal"]) fs.rmSync(targetFile + sidecar, { force: true });
  fs.rmSync(lockFileOf(targetFile), { force: true }); // stale by now: serverHolding found no live holder
  fs.renameSync(staging, targetFile);
  return { backupFile, targetFile, replaced, ...check };
}
