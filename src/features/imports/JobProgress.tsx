// A validation or import job while it runs: bytes read of the file and rows so far. Jobs run one after
// another on the server, so a queued job says it is waiting.
import type { ImportJob } from "../../../shared/import/api";
import { formatBytes, formatCount } from "./labels";
import { ProgressBar } from "./ProgressBar";

export function JobProgress({ job, fileName }: { job: ImportJob | undefined; fileName: string }) {
  const verb = job?.mode === "import" ? "Importing" : "Checking";
  if (!job || job.status === "queued") {
    return <ProgressBar label={`${verb} ${fileName}`} fraction={null} detail="waiting for another import to finish" />;
  }
  const { bytesRead, totalBytes, rows } = job.progress;
  const fraction = totalBytes && totalBytes > 0 ? bytesRead / totalBytes : null;
  const detail = [totalBytes ? `${formatBytes(bytesRead)} of ${formatBytes(totalBytes)}` : formatBytes(bytesRead), `${formatCount(rows)} rows`].join(", ");
  return <ProgressBar label={`${verb} ${fileName}`} fraction={fraction} detail={detail} />;
}
