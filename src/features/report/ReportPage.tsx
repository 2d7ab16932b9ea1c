// Funder report (funders and the coordinator): the period's report as a readable page, its stored PDF, a
// clean printout; for the coordinator also today's figures, the text on what the network is doing, report
// versions, releasing and sending to funders. Funders read released versions only, and choose among the
// periods that have one. The period is in the address (?period=2026-Q3 or ?period=2026).
import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import { Link, useSearchParams } from "react-router";
import { periodSchema, type ReportVersion } from "../../../shared/schemas/report";
import { Button } from "../../components/Button";
import { Notice } from "../../components/Notice";
import { PageHeader } from "../../components/PageHeader";
import { EmptyState, ErrorState, LoadingState } from "../../components/States";
import { useCan } from "../auth/useCan";
import { NotesEditor } from "./NotesEditor";
import { defaultPeriod, periodIsRunning, periodKindOf, periodLabel } from "../../../shared/period";
import { PeriodPicker } from "./PeriodPicker";
import { insightQueries } from "../insight/queries";
import { pdfUrl, reportQueries } from "./queries";
import { ReportView } from "./ReportView";
import { SendForm } from "./SendForm";
import { SendHistory } from "./SendHistory";
import { formatKb, VersionsPanel } from "./VersionsPanel";
import { formatDateTime } from "../../lib/formatting";
import "../../styles/print.css";
import { DownloadIcon } from "../../components/DownloadIcon";

export default function ReportPage() {
  // who prepares and sends the report: the text for funders, versions and sending
  const coordinator = useCan("sendReport");
  // the coordinator chooses among the quarters with data (the one filter options query holds them); a funder
  // among the periods with a released version
  const quarters = useQuery({ ...insightQueries.options(), select: (options) => options.quarters, enabled: coordinator });
  const released = useQuery({ ...reportQueries.allVersions(), enabled: !coordinator });
  const choices = coordinator ? quarters : released;
  const releasedPeriods = [...new Set((released.data ?? []).map((v) => v.period))];
  const pickerQuarters = coordinator ? (quarters.data ?? []) : releasedPeriods.filter((p) => periodKindOf(p) === "quarter");
  const pickerYears = coordinator ? undefined : releasedPeriods.filter((p) => periodKindOf(p) === "year");
  const [params, setParams] = useSearchParams();
  const requested = params.get("period");
  const parsed = requested === null ? null : periodSchema.safeParse(requested);
  const fallback = coordinator ? (quarters.data ? defaultPeriod(quarters.data) : null) : (released.data?.[0]?.period ?? null);
  const period = parsed?.success ? parsed.data : fallback;

  function choose(next: string) {
    setParams(
      (previous) => {
        const updated = new URLSearchParams(previous);
        updated.set("period", next);
        return updated;
      },
      { replace: true },
    );
  }

  return (
    <div data-report-page="" className="flex flex-col gap-6">
      <div data-print="hide">
        <PageHeader
          title="Funder report"
          description={
            coordinator
              ? "The network's training quality for one quarter or year, as funders read it. Below the report: your text for funders, report versions and sending."
              : "The network's training quality for one quarter or year: reach, how well compressions are performed, trends and what the network is doing about common errors."
          }
        />
      </div>

      {choices.isPending ? (
        <LoadingState label="Loading the report periods…" />
      ) : choices.isError ? (
        <ErrorState error={choices.error} title="The report periods could not be loaded" onRetry={() => choices.refetch()} />
      ) : period === null ? (
        <EmptyState
          title={coordinator ? "There is nothing to report yet" : "No report has been released yet"}
          action={
            coordinator ? (
              <Link to="/imports" className="font-semibold text-dusk-700 underline underline-offset-2">
                Import class logs and attempts
              </Link>
            ) : undefined
          }
        >
          {coordinator
            ? "No classes or measured attempts have been imported into Quarterbeat."
            : "The coordinator has not released a report to funders yet. You will get an e-mail when one is released."}
        </EmptyState>
      ) : (
        <>
          {requested !== null && !parsed?.success && (
            <Notice tone="error">
              “{requested}” is not a report period. Showing {periodLabel(period)} instead; use a quarter such as 2026-Q3 or a year such as 2026.
            </Notice>
          )}
          <PeriodPicker quarters={pickerQuarters} years={pickerYears} period={period} onChange={choose} />
          <ReportForPeriod key={period} period={period} coordinator={coordinator} />
        </>
      )}
    </div>
  );
}

type Source = "version" | "current";

function ReportForPeriod({ period, coordinator }: { period: string; coordinator: boolean }) {
  const versions = useQuery(reportQueries.versions(period));
  const latest: ReportVersion | undefined = versions.data?.[0];
  // Funders read the latest released version (the server lists no other to them); the coordinator prepares
  // from today's figures and may switch to the latest stored version.
  const [chosen, setChosen] = useState<Source | null>(null);
  const source: Source = coordinator ? (chosen ?? "current") : "version";
  const showVersion = source === "version" && latest !== undefined;
  const preview = useQuery({ ...reportQueries.preview(period), enabled: coordinator && versions.isSuccess && !showVersion });
  const stored = useQuery({ ...reportQueries.versionData(latest?.id ?? 0), enabled: showVersion });
  const running = periodIsRunning(period);

  if (versions.isPending) return <LoadingState label={`Loading the report for ${periodLabel(period)}…`} />;
  if (versions.isError) return <ErrorState error={versions.error} title="The report could not be loaded" onRetry={() => versions.refetch()} />;
  if (!coordinator && !latest) {
    return (
      <EmptyState title={`No report has been released for ${periodLabel(period)}`}>
        Choose another period above. You will get an e-mail when the coordinator releases a report.
      </EmptyState>
    );
  }

  const data = showVersion ? stored.data?.data : preview.data;
  const loading = showVersion ? stored.isPending : preview.isPending;
  const error = showVersion ? stored.error : preview.error;

  const sourceNote = showVersion ? (
    <p>
      You are reading <strong>version {latest.version}</strong>, created {formatDateTime(latest.createdAt)}
      {latest.createdBy ? ` by ${latest.createdBy}` : ""}: the same figures as its PDF.
    </p>
  ) : latest ? (
    <p>
      You are reading <strong>today's figures</strong>. The latest stored version is {latest.version}, created {formatDateTime(latest.createdAt)}; imports since
      then may have changed some figures.
    </p>
  ) : (
    <p>
      You are reading <strong>today's figures</strong>.{" "}
      {coordinator ? "No version has been stored yet: create one below to make the PDF." : "No PDF has been made for this period yet."}
    </p>
  );

  return (
    <>
      <div data-print="hide" className="flex flex-col gap-3">
        <div className="flex flex-wrap items-center gap-3">
          {latest ? (
            <a
              href={pdfUrl(latest.id)}
              download
              className="inline-flex min-h-11 items-center gap-2 rounded-control border border-dusk-700 bg-dusk-700 px-4 font-medium text-white hover:bg-dusk-800"
            >
              <DownloadIcon />
              Download PDF
              <span className="font-normal">
                (version {latest.version}, {formatKb(latest.pdfBytes)})
              </span>
            </a>
          ) : (
            <p className="text-small text-muted">
              No PDF yet for {periodLabel(period)}:{" "}
              {coordinator ? "create a report version below." : "the coordinator has not created a report version for this period."}
            </p>
          )}
          <Button variant="secondary" onClick={() => window.print()}>
            Print this page
          </Button>
          {coordinator && (
            <a href="#prepare-heading" className="text-small font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
              Go to your text, versions and sending
            </a>
          )}
        </div>
        {coordinator && latest && (
          <div role="radiogroup" aria-label="Figures to show" className="flex flex-wrap items-center gap-x-4 gap-y-1 text-small">
            <span className="font-semibold" aria-hidden="true">
              Show:
            </span>
            {(
              [
                ["version", `Version ${latest.version} (as in the PDF)`],
                ["current", "Today's figures"],
              ] as const
            ).map(([value, label]) => (
              <label key={value} className="flex min-h-9 cursor-pointer items-center gap-2">
                <input
                  type="radio"
                  name="report-source"
                  value={value}
                  checked={source === value}
                  onChange={() => setChosen(value)}
                  className="size-4 accent-dusk-700"
                />
                {label}
              </label>
            ))}
          </div>
        )}
        {running && <Notice tone="info">{periodLabel(period)} has not ended yet: its figures will change as more classes and attempts are imported.</Notice>}
      </div>

      {loading ? (
        <LoadingState label={`Loading the report for ${periodLabel(period)}…`} />
      ) : error || !data ? (
        <ErrorState error={error} title="The report could not be loaded" onRetry={() => (showVersion ? stored.refetch() : preview.refetch())} />
      ) : (
        <ReportView data={data} source={sourceNote} actionsSlot={coordinator && !showVersion ? <NotesEditor period={period} /> : undefined} />
      )}

      {coordinator && (
        <section data-print="hide" aria-labelledby="prepare-heading" className="mt-4 flex flex-col gap-8 border-t-4 border-dusk-200 pt-6">
          <div>
            <h2 id="prepare-heading" tabIndex={-1} className="scroll-mt-24 text-headline outline-none">
              Prepare and send
            </h2>
            <p className="text-muted">Only coordinators see this part. Funders read the latest version you released or sent, and download its PDF.</p>
          </div>
          <VersionsPanel period={period} versions={versions.data} onCreated={() => undefined} />
          <section aria-labelledby="send-heading" className="flex flex-col gap-3">
            <h3 id="send-heading" className="text-lead font-semibold">
              Send to funders
            </h3>
            <SendForm period={period} versions={versions.data} />
          </section>
          <SendHistory />
        </section>
      )}
    </>
  );
}
