// One received message: its envelope, its text as sent, and its attachments to download.
import { forwardRef } from "react";
import type { OutboxMessage } from "../../../shared/schemas/report";
import { Button } from "../../components/Button";
import { attachmentUrl } from "./queries";
import { formatDateTime } from "../../lib/formatting";
import { formatSize } from "./format";
import { DownloadIcon } from "../../components/DownloadIcon";

export interface MessageViewProps {
  message: OutboxMessage;
  onClose: () => void;
}

export const MessageView = forwardRef<HTMLHeadingElement, MessageViewProps>(function MessageView({ message, onClose }, headingRef) {
  return (
    <article
      aria-labelledby={`message-${message.id}-subject`}
      className="flex flex-col gap-4 rounded-card border border-line-strong bg-surface p-4 shadow-card sm:p-6"
    >
      <div className="flex flex-wrap items-start justify-between gap-3">
        <h2 id={`message-${message.id}-subject`} ref={headingRef} tabIndex={-1} className="min-w-0 scroll-mt-24 text-title break-words outline-none">
          {message.subject || "(no subject)"}
        </h2>
        <Button variant="secondary" size="sm" onClick={onClose}>
          Close message
        </Button>
      </div>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-small">
        <dt className="font-semibold text-muted">Received</dt>
        <dd>{formatDateTime(message.receivedAt)}</dd>
        <dt className="font-semibold text-muted">From</dt>
        <dd className="min-w-0 break-words">{message.from}</dd>
        <dt className="font-semibold text-muted">To</dt>
        <dd className="min-w-0 break-words">{message.recipients.join(", ")}</dd>
      </dl>
      <div className="rounded-control border border-line bg-paper p-4">
        <h3 className="sr-only">Message text</h3>
        {message.text.trim() ? (
          <p className="text-body break-words whitespace-pre-wrap">{message.text}</p>
        ) : (
          <p className="text-muted">This message has no text part.</p>
        )}
      </div>
      <section aria-labelledby={`message-${message.id}-attachments`}>
        <h3 id={`message-${message.id}-attachments`} className="text-lead font-semibold">
          Attachments ({message.attachments.length})
        </h3>
        {message.attachments.length === 0 ? (
          <p className="text-small text-muted">None.</p>
        ) : (
          <ul className="mt-2 flex flex-col gap-2">
            {message.attachments.map((attachment) => (
              <li key={attachment.index} className="flex flex-wrap items-center gap-3">
                <a
                  href={attachmentUrl(message.id, attachment.index)}
                  download={attachment.filename}
                  className="inline-flex min-h-11 items-center gap-2 rounded-control border border-line-strong bg-surface px-4 font-medium text-dusk-800 hover:bg-dusk-50"
                >
                  <DownloadIcon />
                  Download {attachment.filename}
                </a>
                <span className="text-small text-muted">
                  {attachment.contentType}, {formatSize(attachment.size)}
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
    </article>
  );
});
