// Whether a process id on this host still belongs to a running process: the test behind stale lock files and
// orphaned upload folders.
export function processIsAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    // EPERM: the process exists but belongs to someone else
    return (err as NodeJS.ErrnoException).code === "EPERM";
  }
}
