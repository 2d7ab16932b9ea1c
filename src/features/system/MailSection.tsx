// Where mail goes and what became of it. Mail is sent at once, never queued: a failed report send waits for a
// coordinator to retry it from the funder report page.
import type { SystemReport } from "../../../shared/schemas/system";
import { formatCount, formatDateTime } from "../imports/labels";

export function MailSection({ mail }: { mail: SystemReport["mail"] }) {
  return (
    <section aria-labelledby="system-mail" className="flex flex-col gap-3">
      <h2 id="system-mail" className="text-title">
        Mail
      </h2>
      <p>
        {mail.delivery === "smtp"
          ? `Mail is sent through ${mail.server}.`
          : "No mail server is set up: the local mail service keeps every message in the Outbox; nothing leaves this machine."}
      </p>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
        <dt className="font-semibold text-muted">Report sends delivered</dt>
        <dd className="tabular-nums">{formatCount(mail.reportSends.sent)}</dd>
        <dt className="font-semibold text-muted">Report sends failed, waiting for a retry</dt>
        <dd className="tabular-nums">{formatCount(mail.reportSends.failed)}</dd>
        <dt className="font-semibold text-muted">Messages in the Outbox</dt>
        <dd className="tabular-nums">{formatCount(mail.outboxMessages)}</dd>
      </dl>
      {mail.lastFailure && (
        <p className="text-small text-muted">
          Last failed send: {formatDateTime(mail.lastFailure.at)}, {mail.lastFailure.error ?? "no reason recorded"}.
        </p>
      )}
    </section>
  );
}
