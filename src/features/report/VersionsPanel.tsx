// The stored versions of a period's report, and "Create report version": each version keeps its figures
// and its PDF exactly as they were, so what funders received can always be downloaded again.
import { useMutation } from "@tanstack/react-query";
import { useState } from "react";
import type { ReportVersion } from "../../../shared/schemas/report";
import { Button } from "../../components/Button";
import { formatDateTime } from "../../lib/formatting";
import { Notice } from "../../components/Notice";
import { errorMessage } from "../../components/States";
import { periodLabel } from "../../../shared/period";
import { createVersion, csvUrl, pdfUrl, releaseVersion, reportQueries } from "./queries";
import { ReportTable } from "./ReportTable";

export const formatKb = (bytes: number) => `${Math.max(1, Math.round(bytes / 1024))} kB`;

export interface VersionsPanelProps {
  period: string;
  versions: readonly ReportVersion[];
  onCreated: (version: ReportVersion) => void;
}

export function VersionsPanel({ period, versions, onCreated }: VersionsPanelProps) {
  const [message, setMessage] = useState<{ tone: "success" | "error"; text: string } | null>(null);
  const [includeActions, setIncludeActions] = useState(false);
  const create = useMutation({
    mutationFn: () => createVersion(period, includeActions),
    meta: { invalidates: [reportQueries.all()] },
  });
  const release = useMutation({
    mutationFn: releaseVersion,
    meta: { invalidates: [reportQueries.all()] },
  });

  function runRelease(version: ReportVersion) {
    setMessage(null);
    release.mutate(version.id, {
      onSuccess: ({ report, notified, failed }) => {
        const parts = [`Version ${report.version} of ${periodLabel(period)} is released: funders can read it now.`];
        if (notified.length > 0) parts.push(`A notice went to ${notified.join(", ")}.`);
        if (failed.length > 0) parts.push(`The notice could not reach ${failed.map((f) => f.address).join(", ")} (${failed[0].error}).`);
        if (notified.length + failed.length === 0) parts.push("No funder account is active, so no notice went out.");
        setMessage({ tone: failed.length > 0 ? "error" : "success", text: parts.join(" ") });
      },
      onError: (error) => setMessage({ tone: "error", text: `The version was not released: ${errorMessage(error)}` }),
    });
  }

  function run() {
    setMessage(null);
    create.mutate(undefined, {
      onSuccess: (version) => {
        setMessage({
          tone: "success",
          text: `Version ${version.version} of ${periodLabel(period)} is stored (PDF, ${formatKb(version.pdfBytes)}). Funders see it once you release or send it.`,
        });
        onCreated(version);
      },
      onError: (error) => setMessage({ tone: "error", text: `No version was created: ${errorMessage(error)}` }),
    });
  }

  return (
    <section aria-labelledby="versions-heading" className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div className="max-w-2xl">
          <h3 id="versions-heading" className="text-lead font-semibold">
            Report versions for {periodLabel(period)}
          </h3>
          <p className="text-small text-muted">
            Creating a version stores today's figures, your text and the PDF. Funders see a version once you release it or send it to them, and read the latest
            one released; earlier ones stay here unchanged.
          </p>
        </div>
        {/* on a phone this block falls under the heading: there it lines up on the left like the rest */}
        <div className="flex flex-col items-start gap-2 lg:items-end">
          <label className="inline-flex max-w-xs items-start gap-2 text-small">
            <input type="checkbox" className="mt-1" checked={includeActions} onChange={(event) => setIncludeActions(event.target.checked)} />
            <span>
              Include the improvement actions
              <span className="block text-caption text-muted">
                Title, aim, start and status of those started by the period&apos;s end; never the owner, and none aimed at one instructor.
              </span>
            </span>
          </label>
          <Button onClick={run} busy={create.isPending}>
            Create report version
          </Button>
        </div>
      </div>
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
      {versions.length === 0 ? (
        <p className="rounded-card border border-dashed border-line-strong bg-surface p-4 text-muted">
          No version has been created for {periodLabel(period)} yet.
        </p>
      ) : (
        <ReportTable
          caption={`Report versions for ${periodLabel(period)}`}
          rows={versions}
          rowKey={(v) => String(v.id)}
          columns={[
            // the table scrolls sideways on a phone rather than break a version's name or date
            { header: "Version", cell: (v) => <span className="whitespace-nowrap">Version {v.version}</span> },
            { header: "Created", cell: (v) => <span className="whitespace-nowrap">{formatDateTime(v.createdAt)}</span> },
            { header: "By", cell: (v) => v.createdBy ?? "command line" },
            {
              header: "Funders",
              cell: (v) =>
                v.releasedAt ? (
                  `Released ${formatDateTime(v.releasedAt)}`
                ) : (
                  <Button size="sm" variant="secondary" onClick={() => runRelease(v)} busy={release.isPending && release.variables === v.id}>
                    Release to funders<span className="sr-only"> version {v.version}</span>
                  </Button>
                ),
            },
            {
              header: "Last sent",
              cell: (v) => (v.lastSend ? `${v.lastSend.status === "sent" ? "Sent" : "Failed"} ${formatDateTime(v.lastSend.createdAt)}` : "Not sent"),
            },
            {
              header: "Downloads",
              cell: (v) => (
                <span className="flex flex-wrap gap-x-3">
                  <a href={pdfUrl(v.id)} download className="font-medium text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
                    PDF<span className="sr-only"> of version {v.version}</span> ({formatKb(v.pdfBytes)})
                  </a>
                  <a href={csvUrl(v.id)} download className="font-medium text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
                    Figures as CSV<span className="sr-only"> of version {v.version}</span>
                  </a>
                </span>
              ),
            },
          ]}
        />
      )}
    </section>
  );
}
