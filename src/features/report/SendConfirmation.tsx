// The last step before a report goes out: the exact stored PDF that will be attached (shown in the page and
// downloadable), the cover note, the period and version, and every recipient by address. Nothing is sent
// until the coordinator confirms here.
import { useQuery } from "@tanstack/react-query";
import { useEffect, useRef } from "react";
import type { ReportVersion } from "../../../shared/schemas/report";
import { periodLabel } from "../../../shared/period";
import { Button } from "../../components/Button";
import { Notice } from "../../components/Notice";
import { formatKb } from "./VersionsPanel";
import { pdfPreviewUrl, pdfUrl, reportQueries } from "./queries";

export interface SendConfirmationProps {
  version: ReportVersion;
  coverNote: string;
  recipients: readonly string[];
  busy: boolean;
  onConfirm: () => void;
  onBack: () => void;
}

export function SendConfirmation({ version, coverNote, recipients, busy, onConfirm, onBack }: SendConfirmationProps) {
  const heading = useRef<HTMLHeadingElement>(null);
  // a version stored before the coordinator wrote about the errors prints a stand-in sentence instead
  const stored = useQuery(reportQueries.versionData(version.id));
  const noActionsText = stored.data !== undefined && stored.data.data.hasData && stored.data.data.errors.actions.trim() === "";
  // the step replaces the form: move focus to it so keyboard and screen-reader users land on what to check
  useEffect(() => heading.current?.focus(), []);
  const period = periodLabel(version.period);
  const count = `${recipients.length} recipient${recipients.length === 1 ? "" : "s"}`;

  return (
    <section aria-labelledby="send-check-heading" className="flex flex-col gap-4 rounded-card border-2 border-dusk-200 bg-surface p-4">
      <h4 id="send-check-heading" ref={heading} tabIndex={-1} className="text-lead font-semibold outline-none">
        Check before sending: {period}, version {version.version}
      </h4>
      <div className="flex flex-col gap-1">
        <p className="font-semibold">Goes to {count}, each in a message of their own (no one sees the other addresses):</p>
        <ul aria-label="Recipients" className="flex flex-wrap gap-x-4 gap-y-1 text-small break-all">
          {recipients.map((address) => (
            <li key={address}>{address}</li>
          ))}
        </ul>
      </div>
      {noActionsText && (
        <Notice tone="info">
          This version was stored before you wrote what the network is doing about the errors, so its PDF says that you have not written it yet. To send your
          text, write it above the report, create a new version and send that one.
        </Notice>
      )}
      <div className="flex flex-col gap-1">
        <p className="font-semibold">Cover note</p>
        <blockquote className="max-w-3xl border-l-4 border-marigold-500 pl-3 whitespace-pre-wrap">{coverNote}</blockquote>
      </div>
      <div className="flex flex-col gap-2">
        <p className="font-semibold">
          Attached PDF{" "}
          <span className="font-normal text-muted">
            (version {version.version}, {formatKb(version.pdfBytes)}; funders receive exactly this file)
          </span>
        </p>
        <iframe
          src={pdfPreviewUrl(version.id)}
          title={`PDF of ${period}, version ${version.version}, as it will be attached`}
          className="h-[28rem] w-full max-w-4xl rounded-control border border-line-strong bg-paper sm:h-[36rem]"
        />
        <a href={pdfUrl(version.id)} download className="self-start text-small font-medium text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
          Download the PDF of version {version.version}
        </a>
      </div>
      <div className="flex flex-wrap gap-3">
        <Button onClick={onConfirm} busy={busy}>
          Send to {count}
        </Button>
        <Button variant="secondary" onClick={onBack} disabled={busy}>
          Back to editing
        </Button>
      </div>
    </section>
  );
}
