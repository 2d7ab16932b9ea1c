// The signals mailed after imports, newest first: when, what kind, what the message said in one line, and the
// page behind it. With `recipients`, each signal once with how many people it went to (a coordinator's view).
import { Link } from "react-router";
import { alertKindLabels } from "../../../shared/alertKinds";
import type { AlertDelivery } from "../../../shared/schemas/alerts";
import { DataTable, type Column } from "../../components/DataTable";
import { formatCount, formatDateTime } from "../../lib/formatting";

type Row = AlertDelivery & { recipients?: number };

export function AlertHistoryTable({ rows, caption, showRecipients }: { rows: readonly Row[]; caption: string; showRecipients: boolean }) {
  const columns: Column<Row>[] = [
    { key: "sent", header: "Sent", value: (r) => r.sentAt, render: (r) => formatDateTime(r.sentAt), sortLabels: { asc: "oldest first", desc: "newest first" } },
    { key: "kind", header: "Kind", value: (r) => alertKindLabels[r.kind], wrap: true },
    { key: "summary", header: "What it said", value: (r) => r.summary, primary: true, wrap: true },
    ...(showRecipients
      ? [
          {
            key: "recipients",
            header: "People",
            align: "right" as const,
            value: (r: Row) => r.recipients ?? 0,
            render: (r: Row) => formatCount(r.recipients ?? 0),
          },
        ]
      : []),
    {
      key: "link",
      header: "Page",
      exportable: false,
      sortable: false,
      value: (r) => r.link?.label ?? "",
      render: (r) =>
        r.link ? (
          <Link to={r.link.path} className="font-medium text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
            {r.link.label}
          </Link>
        ) : (
          <span className="text-muted">none</span>
        ),
    },
  ];
  return (
    <DataTable
      caption={caption}
      columns={columns}
      rows={rows}
      rowKey={(r) => r.key}
      initialSort={{ key: "sent", direction: "desc" }}
      exportFileName="alerts.csv"
      emptyMessage="No alerts have been mailed yet."
      phoneLayout="cards"
    />
  );
}
