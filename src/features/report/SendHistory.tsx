// Every send of a report, sent or failed, with the exact recipients. A failed send can be tried again: the
// same stored PDF to the same people, without creating a new version.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import type { ReportSendRow } from "../../../shared/schemas/report";
import { Button } from "../../components/Button";
import { DataTable, type Column } from "../../components/DataTable";
import { Notice } from "../../components/Notice";
import { EmptyState, ErrorState, LoadingState, errorMessage } from "../../components/States";
import { periodLabel } from "../../../shared/period";
import { reportQueries, retrySend } from "./queries";
import { formatDateTime } from "../../lib/formatting";

function SendStatus({ send }: { send: ReportSendRow }) {
  const sent = send.status === "sent";
  return (
    <span
      className={`inline-flex items-center gap-1.5 rounded-full border px-2 py-0.5 text-caption font-semibold whitespace-nowrap ${sent ? "border-on-target-text/40 bg-on-target-tint text-on-target-text" : "border-danger-line bg-danger-tint text-danger-text"}`}
    >
      <span aria-hidden="true">{sent ? "✓" : "!"}</span>
      {sent ? "Sent" : "Failed"}
    </span>
  );
}

export function SendHistory() {
  const queryClient = useQueryClient();
  const sends = useQuery(reportQueries.sends());
  const [message, setMessage] = useState<{ tone: "success" | "error"; text: string } | null>(null);
  const retry = useMutation({
    mutationFn: retrySend,
    onSettled: () => queryClient.invalidateQueries({ queryKey: reportQueries.all() }),
  });

  function runRetry(send: ReportSendRow) {
    setMessage(null);
    retry.mutate(send.id, {
      onSuccess: (row) =>
        setMessage(
          row.status === "sent"
            ? { tone: "success", text: `Version ${row.version} of ${periodLabel(row.period)} is now sent to ${row.recipients.join(", ")}.` }
            : { tone: "error", text: `Sending failed again: ${row.error ?? "the mail server did not accept it"}.` },
        ),
      onError: (error) => setMessage({ tone: "error", text: `The retry did not run: ${errorMessage(error)}` }),
    });
  }

  const columns: Column<ReportSendRow>[] = [
    {
      key: "when",
      header: "When",
      value: (s) => s.createdAt,
      render: (s) => formatDateTime(s.createdAt),
      sortLabels: { asc: "oldest first", desc: "newest first" },
    },
    {
      key: "report",
      header: "Report",
      value: (s) => `${s.period} v${s.version}`,
      render: (s) => `${periodLabel(s.period)}, version ${s.version}`,
      primary: true,
    },
    { key: "to", header: "To", value: (s) => s.recipients.join(", "), wrap: true },
    { key: "by", header: "Sent by", value: (s) => s.sentBy ?? "" },
    {
      key: "status",
      header: "Status",
      value: (s) => (s.status === "sent" ? "Sent" : `Failed: ${s.error ?? ""}`),
      render: (s) => (
        <span className="flex flex-col items-start gap-1">
          <SendStatus send={s} />
          {s.error && <span className="max-w-xs text-caption whitespace-normal text-danger-text">{s.error}</span>}
        </span>
      ),
    },
    {
      key: "actions",
      header: "Actions",
      sortable: false,
      exportable: false,
      value: () => "",
      render: (s) =>
        s.status === "failed" ? (
          <Button size="sm" variant="secondary" onClick={() => runRetry(s)} busy={retry.isPending && retry.variables === s.id}>
            Retry
            <span className="sr-only">
              {" "}
              sending {periodLabel(s.period)} version {s.version}
            </span>
          </Button>
        ) : null,
    },
  ];

  return (
    <section aria-labelledby="sends-heading" className="flex flex-col gap-3">
      <h3 id="sends-heading" className="text-lead font-semibold">
        Send history
      </h3>
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
      {sends.isPending ? (
        <LoadingState label="Loading the send history…" />
      ) : sends.isError ? (
        <ErrorState error={sends.error} title="The send history could not be loaded" onRetry={() => sends.refetch()} />
      ) : sends.data.length === 0 ? (
        <EmptyState title="No report has been sent yet" />
      ) : (
        <DataTable caption="Send history" captionHidden columns={columns} rows={sends.data} rowKey={(s) => s.id} filterable={sends.data.length > 8} />
      )}
    </section>
  );
}
