// Uploads are kept in memory, so a server that stops forgets them while their files stay on disk. Each server
// process keeps its uploads in a folder of its own whose name carries its process id; at start-up the folders
// of processes that are gone are removed. Folders of live processes (another server, a test worker) are left
// alone, so several servers can share the temp folder.
import fs from "node:fs";
import path from "node:path";
import { processIsAlive } from "../ops/processAlive";

const PREFIX = "quarterbeat-uploads-";
/** quarterbeat-uploads-<pid>-<six random characters from mkdtemp> */
const OWNED_NAME = /^quarterbeat-uploads-(\d+)-[A-Za-z0-9]{6}$/;
/** A folder without a process id in its name (from an older version) is swept once it is this old. */
const UNOWNED_KEEP_MS = 6 * 60 * 60 * 1000;

/** The prefix for this process's upload folder, for fs.mkdtemp. */
export function uploadFolderPrefix(root: string): string {
  return path.join(root, `${PREFIX}${process.pid}-`);
}

function isOrphaned(dir: string, name: string, now: number): boolean {
  const owner = OWNED_NAME.exec(name);
  if (owner) return !processIsAlive(Number(owner[1]));
  return now - fs.statSync(dir).mtimeMs > UNOWNED_KEEP_MS;
}

/** Removes the upload folders under `root` whose server has stopped; answers the folders removed. */
export function sweepOrphanedUploadFolders(root: string, now = Date.now()): string[] {
  const removed: string[] = [];
  let entries: fs.Dirent[];
  try {
    entries = fs.readdirSync(root, { withFileTypes: true });
  } catch {
    return removed;
  }
  const uid = process.getuid?.();
  for (const entry of entries) {
    if (!entry.isDirectory() || !entry.name.startsWith(PREFIX)) continue;
    const dir = path.join(root, entry.name);
    try {
      if (uid !== undefined && fs.statSync(dir).uid !== uid) continue; // another user's server
      if (!isOrphaned(dir, entry.name, now)) continue;
      fs.rmSync(dir, { recursive: true, force: true });
      removed.push(dir);
    } catch {
      // gone already (another server swept it) or not ours to remove: leave it
    }
  }
  return removed;
}
