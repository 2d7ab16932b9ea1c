// Outbox (coordinator): the e-mail Quarterbeat's local mail service received instead of sending it, so the
// coordinator can read exactly what funders and new users would get. The open message is in the address
// (?message=12), so it can be linked to.
import { useQuery } from "@tanstack/react-query";
import { useEffect, useRef } from "react";
import { useSearchParams } from "react-router";
import type { OutboxMessage } from "../../../shared/schemas/report";
import { Button } from "../../components/Button";
import { DataTable, type Column } from "../../components/DataTable";
import { PageHeader } from "../../components/PageHeader";
import { EmptyState, ErrorState, LoadingState } from "../../components/States";
import { formatDateTime } from "../../lib/formatting";
import { MessageView } from "./MessageView";
import { outboxQueries } from "./queries";

export default function OutboxPage() {
  const messages = useQuery(outboxQueries.list());
  const [params, setParams] = useSearchParams();
  const openId = Number(params.get("message"));
  const open = messages.data?.find((m) => m.id === openId) ?? null;
  const headingRef = useRef<HTMLHeadingElement>(null);
  const returnFocus = useRef<HTMLElement | null>(null);

  useEffect(() => {
    if (!open) return;
    headingRef.current?.focus();
    headingRef.current?.scrollIntoView?.({ block: "start", behavior: "smooth" });
  }, [open]);

  function show(id: number | null) {
    if (id !== null) returnFocus.current = document.activeElement as HTMLElement | null;
    setParams(
      (previous) => {
        const next = new URLSearchParams(previous);
        if (id === null) next.delete("message");
        else next.set("message", String(id));
        return next;
      },
      { replace: id === null },
    );
    if (id === null) setTimeout(() => returnFocus.current?.focus(), 0);
  }

  const columns: Column<OutboxMessage>[] = [
    {
      key: "received",
      header: "Received",
      value: (m) => m.receivedAt,
      render: (m) => formatDateTime(m.receivedAt),
      sortLabels: { asc: "oldest first", desc: "newest first" },
    },
    { key: "from", header: "From", value: (m) => m.from },
    { key: "to", header: "To", value: (m) => m.recipients.join(", "), wrap: true },
    {
      key: "subject",
      header: "Subject",
      primary: true,
      wrap: true,
      value: (m) => m.subject,
      render: (m) => (
        <button
          type="button"
          onClick={() => show(m.id)}
          aria-current={m.id === openId ? "true" : undefined}
          className="text-left font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900"
        >
          {m.subject || "(no subject)"}
        </button>
      ),
    },
    {
      key: "attachments",
      header: "Attachments",
      value: (m) => m.attachments.map((a) => a.filename).join(", "),
      render: (m) => (m.attachments.length === 0 ? <span className="text-muted">none</span> : m.attachments.map((a) => a.filename).join(", ")),
      wrap: true,
    },
  ];

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Outbox"
        description="While no mail server is set up, Quarterbeat keeps outgoing mail here instead of sending it: nothing listed here has left this machine."
        actions={
          <Button variant="secondary" onClick={() => messages.refetch()} busy={messages.isFetching && !messages.isPending}>
            Check for new mail
          </Button>
        }
      />
      {messages.isPending ? (
        <LoadingState label="Loading the outbox…" />
      ) : messages.isError ? (
        <ErrorState error={messages.error} title="The outbox could not be loaded" onRetry={() => messages.refetch()} />
      ) : messages.data.length === 0 ? (
        <EmptyState title="The outbox is empty">
          Nothing has been sent yet. A report sent from the funder report page, or a welcome message for a new user, appears here.
        </EmptyState>
      ) : (
        <>
          <DataTable caption="Received messages" captionHidden columns={columns} rows={messages.data} rowKey={(m) => m.id} emptyMessage="No messages." />
          {params.get("message") && !open && (
            <p className="text-muted">Message {params.get("message")} is not in the outbox (it may be older than the 200 newest).</p>
          )}
          {open && <MessageView ref={headingRef} message={open} onClose={() => show(null)} />}
        </>
      )}
    </div>
  );
}
