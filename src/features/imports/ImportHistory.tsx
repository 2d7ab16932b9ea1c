// Every import batch: who, when, which file, what it changed and whether it still stands. Coordinators can
// undo a batch; anyone can open the rows a batch refused. Instructors see their own batches only.
import { useInfiniteQuery, useMutation, useQuery } from "@tanstack/react-query";
import { useEffect, useMemo, useRef, useState } from "react";
import type { ImportBatch } from "../../../shared/import/api";
import { Button } from "../../components/Button";
import { DataTable, type Column } from "../../components/DataTable";
import { Dialog } from "../../components/Dialog";
import { Notice } from "../../components/Notice";
import { EmptyState, ErrorState, LoadingState, errorMessage } from "../../components/States";
import { useCan } from "../auth/useCan";
import { formatCount, formatDateTime, importedBy, kindLabels, plural } from "./labels";
import { importQueries, undoBatch, type RejectedRow } from "./queries";

type Message = { tone: "success" | "error"; text: string } | null;

const sourceLabels: Record<ImportBatch["source"], string> = { web: "web", cli: "command line", seed: "demo data" };

export function ImportHistory({ highlightBatch }: { highlightBatch?: number | null }) {
  const mayUndo = useCan("undoImport");
  const seesEveryImport = useCan("importData", "any");
  const history = useInfiniteQuery(importQueries.history());
  const [openBatch, setOpenBatch] = useState<ImportBatch | null>(null);
  const [undoing, setUndoing] = useState<ImportBatch | null>(null);
  const [message, setMessage] = useState<Message>(null);

  const batches = useMemo(() => history.data?.pages.flatMap((page) => page.batches) ?? [], [history.data]);
  const total = history.data?.pages[0]?.total ?? 0;

  const columns = useMemo<Column<ImportBatch>[]>(
    () => [
      {
        key: "when",
        header: "When",
        value: (b) => b.createdAt,
        render: (b) => formatDateTime(b.createdAt),
        sortLabels: { asc: "oldest first", desc: "newest first" },
      },
      { key: "who", header: "Who", value: (b) => importedBy(b), render: (b) => <Who batch={b} />, wrap: true },
      {
        key: "file",
        header: "File",
        value: (b) => `${b.fileName} (batch ${b.id})`,
        primary: true,
        render: (b) => (
          <span>
            <span className="font-medium">{b.fileName}</span>
            <span className="block text-caption text-muted">
              batch {b.id} · {kindLabels[b.kind].toLowerCase()}
              {b.id === highlightBatch && <span className="ml-1 rounded-full bg-marigold-100 px-1.5 font-semibold text-ink">just imported</span>}
            </span>
          </span>
        ),
      },
      {
        key: "counts",
        header: "Rows",
        value: (b) => `${b.rowsRead} read, ${b.inserted} added, ${b.updated} updated, ${b.unchanged} unchanged`,
        sortable: false,
        render: (b) => (
          <span className="tabular-nums">
            <span className="block">{formatCount(b.rowsRead)} read</span>
            <span className="block text-caption text-muted">
              {formatCount(b.inserted)} added · {formatCount(b.updated)} updated · {formatCount(b.unchanged)} unchanged
            </span>
          </span>
        ),
      },
      {
        key: "rejected",
        header: "Refused",
        value: (b) => b.rejected,
        render: (b) => <span className={b.rejected > 0 ? "font-semibold text-danger-text" : undefined}>{formatCount(b.rejected)}</span>,
        align: "right",
      },
      {
        key: "status",
        header: "Status",
        value: (b) => (b.status === "applied" ? "Applied" : `Undone ${b.undoneAt ? formatDateTime(b.undoneAt) : ""}`.trim()),
        render: (b) => <BatchStatus batch={b} />,
      },
      {
        key: "actions",
        header: "Actions",
        sortable: false,
        exportable: false,
        value: () => "",
        render: (b) => (
          <div className="-mx-2.5 flex flex-wrap gap-0.5 sm:flex-col sm:items-start">
            {b.rejected > 0 && (
              <Button size="sm" variant="quiet" onClick={() => setOpenBatch(b)} aria-label={`Refused rows of batch ${b.id}`}>
                Refused rows
              </Button>
            )}
            {mayUndo && b.status === "applied" && (
              <Button size="sm" variant="dangerQuiet" onClick={() => setUndoing(b)} aria-label={`Undo batch ${b.id}`}>
                Undo
              </Button>
            )}
            {/* an undone batch keeps a readable row: say why it offers no undo, so the column never empties */}
            {b.status === "undone" && b.rejected === 0 && <span className="px-2.5 text-small text-muted">Already undone</span>}
          </div>
        ),
      },
    ],
    [mayUndo, highlightBatch],
  );

  return (
    <section aria-labelledby="history-heading" className="flex flex-col gap-3">
      <div>
        <h2 id="history-heading" className="text-title">
          Import history
        </h2>
        <p className="text-small text-muted">
          {seesEveryImport
            ? "Every import into the network, newest first. Undo takes a batch's changes back out."
            : "Your imports, newest first. Ask the coordinator if an import needs to be undone."}
        </p>
      </div>
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
      {history.isPending ? (
        <LoadingState label="Loading the import history…" />
      ) : history.isError ? (
        <ErrorState error={history.error} title="The import history could not be loaded" onRetry={() => history.refetch()} />
      ) : batches.length === 0 ? (
        <EmptyState title="No imports yet">Files you import appear here with what they changed.</EmptyState>
      ) : (
        <>
          <DataTable
            caption="Import history"
            captionHidden
            columns={columns}
            rows={batches}
            rowKey={(b) => b.id}
            exportFileName="quarterbeat-import-history"
            phoneLayout="cards"
          />
          <div className="flex flex-wrap items-center gap-3 text-small text-muted">
            <span>
              Showing {formatCount(batches.length)} of {formatCount(total)} imports.
            </span>
            {history.hasNextPage && (
              <Button variant="secondary" size="sm" onClick={() => history.fetchNextPage()} busy={history.isFetchingNextPage}>
                Show older imports
              </Button>
            )}
          </div>
        </>
      )}

      {openBatch && <RejectedRowsPanel batch={openBatch} onClose={() => setOpenBatch(null)} />}

      <UndoDialog
        batch={undoing}
        onClose={() => setUndoing(null)}
        onDone={(text) => {
          setUndoing(null);
          setMessage({ tone: "success", text });
        }}
      />
    </section>
  );
}

/** The importer's address, allowed to break before the "@" so the table stays narrow. */
function Who({ batch }: { batch: ImportBatch }) {
  const email = batch.userEmail;
  if (!email || !email.includes("@")) return <span title={`via ${sourceLabels[batch.source]}`}>{importedBy(batch)}</span>;
  const at = email.indexOf("@");
  return (
    <span title={`${email}, via ${sourceLabels[batch.source]}`}>
      {email.slice(0, at)}
      <wbr />
      <span className="text-muted">{email.slice(at)}</span>
    </span>
  );
}

function BatchStatus({ batch }: { batch: ImportBatch }) {
  const applied = batch.status === "applied";
  // the badge holds one short word; the time of an undo goes beneath it, where it may wrap
  return (
    <span className="flex flex-col items-start gap-0.5">
      <span
        className={`inline-flex items-center gap-1.5 rounded-full border px-2 py-0.5 text-caption font-semibold whitespace-nowrap ${applied ? "border-dusk-300 bg-dusk-50 text-dusk-800" : "border-line-strong bg-paper text-muted"}`}
      >
        <svg viewBox="0 0 10 10" className="size-2.5" aria-hidden="true">
          <circle cx="5" cy="5" r="4" fill={applied ? "currentColor" : "none"} stroke="currentColor" strokeWidth="1.5" />
        </svg>
        {applied ? "Applied" : "Undone"}
      </span>
      {!applied && batch.undoneAt && <span className="text-caption text-muted">{formatDateTime(batch.undoneAt)}</span>}
    </span>
  );
}

type RejectedRowWithKey = RejectedRow & { key: number };

/** The rows a batch refused, with their reasons and the values the file had. */
function RejectedRowsPanel({ batch, onClose }: { batch: ImportBatch; onClose: () => void }) {
  const detail = useQuery(importQueries.batch(batch.id));
  const headingRef = useRef<HTMLHeadingElement>(null);
  useEffect(() => {
    headingRef.current?.focus();
    headingRef.current?.scrollIntoView?.({ block: "start", behavior: "smooth" });
  }, [batch.id]);

  const rows: RejectedRowWithKey[] = useMemo(() => detail.data?.rejectedRows.map((row, key) => ({ ...row, key })) ?? [], [detail.data]);
  const columns: Column<RejectedRowWithKey>[] = [
    { key: "row", header: "Row", value: (r) => r.rowNumber, render: (r) => (r.rowNumber === null ? "Header" : formatCount(r.rowNumber)), align: "right" },
    {
      key: "column",
      header: "Column",
      value: (r) => r.column ?? "",
      render: (r) => (r.column ? <span className="font-mono">{r.column}</span> : <span className="text-muted">whole row</span>),
    },
    { key: "reason", header: "Reason", value: (r) => r.reason, wrap: true, primary: true },
    {
      key: "values",
      header: "Values in the file",
      value: (r) =>
        r.raw
          ? Object.entries(r.raw)
              .map(([k, v]) => `${k}=${v}`)
              .join("; ")
          : "",
      render: (r) =>
        r.raw ? (
          <span className="font-mono text-caption">
            {Object.entries(r.raw)
              .map(([k, v]) => `${k}=${v}`)
              .join("; ")}
          </span>
        ) : (
          ""
        ),
      wrap: true,
      sortable: false,
    },
  ];

  return (
    <section aria-labelledby="rejected-heading" className="flex flex-col gap-3 rounded-card border border-line-strong bg-surface p-4 shadow-card">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h3 id="rejected-heading" ref={headingRef} tabIndex={-1} className="scroll-mt-24 text-lead font-semibold outline-none">
            Refused rows of batch {batch.id}: {batch.fileName}
          </h3>
          <p className="text-small text-muted">Row 1 is the first data row after the header. Correct these rows and import them as a new file.</p>
        </div>
        <div className="flex flex-wrap gap-2">
          <a
            href={`/api/imports/batches/${batch.id}/rejected.csv`}
            download
            className="inline-flex min-h-9 items-center rounded-control border border-line-strong bg-surface px-2.5 text-small font-medium text-dusk-800 hover:bg-dusk-50"
          >
            Download as CSV
          </a>
          <Button size="sm" variant="secondary" onClick={onClose}>
            Close
          </Button>
        </div>
      </div>
      {detail.isPending ? (
        <LoadingState label="Loading the refused rows…" />
      ) : detail.isError ? (
        <ErrorState error={detail.error} title="The refused rows could not be loaded" onRetry={() => detail.refetch()} />
      ) : (
        <>
          {detail.data.rejectedTotal > rows.length && (
            <p className="text-small">
              Showing the first {formatCount(rows.length)} of {formatCount(detail.data.rejectedTotal)}; the CSV holds them all.
            </p>
          )}
          <DataTable
            caption={`Refused rows of batch ${batch.id}`}
            captionHidden
            columns={columns}
            rows={rows}
            rowKey={(r) => r.key}
            filterable={rows.length > 10}
            emptyMessage="This batch refused no rows."
          />
        </>
      )}
    </section>
  );
}

function UndoDialog({ batch, onClose, onDone }: { batch: ImportBatch | null; onClose: () => void; onDone: (message: string) => void }) {
  const undo = useMutation({
    mutationFn: (id: number) => undoBatch(id),
    meta: { changesFigures: true },
  });
  const close = () => {
    undo.reset();
    onClose();
  };
  return (
    <Dialog open={batch !== null} title={batch ? `Undo batch ${batch.id}?` : "Undo import"} onClose={close}>
      {batch && (
        <div className="flex flex-col gap-3">
          <p>
            <strong>{batch.fileName}</strong> ({kindLabels[batch.kind].toLowerCase()}), imported {formatDateTime(batch.createdAt)} by {importedBy(batch)}.
          </p>
          <p>Undo takes this import back out of Quarterbeat:</p>
          <ul className="list-disc pl-5 text-small">
            {batch.inserted > 0 && <li>the {plural(batch.inserted, batch.kind === "compressions" ? "attempt" : "row")} it added are deleted;</li>}
            {batch.updated > 0 && (
              <li>the {plural(batch.updated, batch.kind === "compressions" ? "attempt" : "row")} it changed get back the values they had before;</li>
            )}
            <li>sites, instructors and manikins it created are removed if nothing else uses them.</li>
          </ul>
          <p className="text-small text-muted">
            The batch stays in the history, marked undone. Undo is refused if a later import changed the same rows (undo that one first) or, for class logs,
            while attempts from other imports belong to its classes. The file can be imported again afterwards.
          </p>
          {undo.isError && (
            <Notice tone="error">
              Batch {batch.id} was not undone: {errorMessage(undo.error)}
            </Notice>
          )}
          <div className="flex flex-wrap justify-end gap-2">
            <Button variant="secondary" onClick={close}>
              Keep the import
            </Button>
            <Button
              variant="danger"
              busy={undo.isPending}
              onClick={() =>
                undo.mutate(batch.id, {
                  onSuccess: (result) => {
                    undo.reset();
                    onDone(
                      `Batch ${batch.id} (${batch.fileName}) is undone: ${plural(result.deleted, "row")} deleted, ${plural(result.restored, "row")} restored to earlier values.`,
                    );
                  },
                })
              }
            >
              Undo batch {batch.id}
            </Button>
          </div>
        </div>
      )}
    </Dialog>
  );
}
