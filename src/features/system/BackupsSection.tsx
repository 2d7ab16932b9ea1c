// The backup folder and the last backups with their verification (the backup_log the server and CLI keep).
import type { BackupLogEntry, SystemReport } from "../../../shared/schemas/system";
import { DataTable, type Column } from "../../components/DataTable";
import { Notice } from "../../components/Notice";
import { formatBytes, formatDateTime, plural } from "../imports/labels";

const sourceLabels: Record<BackupLogEntry["source"], string> = { scheduled: "Scheduled", cli: "Command line" };

const columns: Column<BackupLogEntry>[] = [
  {
    key: "taken",
    header: "Taken",
    value: (b) => b.takenAt,
    render: (b) => formatDateTime(b.takenAt),
    sortLabels: { asc: "oldest first", desc: "newest first" },
  },
  {
    key: "result",
    header: "Verification",
    primary: true,
    value: (b) => (b.verified ? "Verified" : "Failed"),
    render: (b) => (b.verified ? "Verified" : <strong className="text-danger-text">Failed</strong>),
  },
  { key: "source", header: "Taken by", value: (b) => sourceLabels[b.source] },
  { key: "size", header: "Size", value: (b) => b.sizeBytes, render: (b) => formatBytes(b.sizeBytes), align: "right" },
  { key: "file", header: "File", value: (b) => b.file, wrap: true },
  { key: "message", header: "Result", value: (b) => b.message, wrap: true },
];

export function BackupsSection({ backups }: { backups: SystemReport["backups"] }) {
  const newest = backups.recent[0];
  return (
    <section aria-labelledby="system-backups" className="flex flex-col gap-3">
      <h2 id="system-backups" className="text-title">
        Backups
      </h2>
      <p className="text-small text-muted break-all">
        {backups.dir
          ? `Scheduled backups: ${plural(backups.filesInDir, "copy", "copies")} (${formatBytes(backups.bytesInDir)}) in ${backups.dir}. Keep a copy of this folder on another machine.`
          : "Scheduled backups are off: copies are taken by hand from the command line."}
      </p>
      {newest && !newest.verified && (
        <Notice tone="error">
          The newest backup ({formatDateTime(newest.takenAt)}) failed its verification: {newest.message}
        </Notice>
      )}
      <p>
        Last verified backup:{" "}
        {backups.lastVerified ? (
          <strong>
            {formatDateTime(backups.lastVerified.takenAt)} ({formatBytes(backups.lastVerified.sizeBytes)})
          </strong>
        ) : (
          <strong>none recorded yet</strong>
        )}
      </p>
      <DataTable
        caption="Last backups"
        columns={columns}
        rows={backups.recent}
        rowKey={(b) => `${b.takenAt} ${b.file}`}
        initialSort={{ key: "taken", direction: "desc" }}
        filterable={false}
        emptyMessage="No backup has been recorded yet."
      />
    </section>
  );
}
