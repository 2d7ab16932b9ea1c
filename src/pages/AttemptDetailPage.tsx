// One attempt: its numbers against the targets of its patient type, the score and result with each error in
// words, the policy version that scored it and any earlier scores, and the compressions themselves where the
// manikin sent a stream.
import { useQuery } from "@tanstack/react-query";
import { useMemo } from "react";
import { Link, useLocation, useParams, useSearchParams } from "react-router";
import { DEFAULT_POLICY } from "../../shared/scoring/policy";
import type { AttemptDetailAnswer } from "../../shared/schemas/insight";
import { ApiError } from "../api/http";
import { DataTable, type Column } from "../components/DataTable";
import { PageHeader } from "../components/PageHeader";
import { SafetyNote } from "../components/SafetyNote";
import { Notice } from "../components/Notice";
import { EmptyState, ErrorState, LoadingState } from "../components/States";
import { TargetBadge } from "../components/TargetBadge";
import { AttemptSummary } from "../features/attempts/AttemptSummary";
import { CompressionCharts } from "../features/attempts/CompressionCharts";
import { compressionSeries, type CompressionSeries } from "../features/attempts/compressionSeries";
import { errorLabel } from "../features/attempts/labels";
import { formatDateTime, formatRecordedDateTime } from "../lib/formatting";
import { attemptQueries } from "../features/attempts/queries";
import { useScoringPolicy } from "../features/attempts/useScoringPolicy";
import { backLabel, inAppPath } from "../features/attempts/returnPath";
import { useLengthUnit } from "../lib/useLengthUnit";
import { dimensionNames, feedbackNames, patientTypeNames } from "../../shared/vocabulary";

export default function AttemptDetailPage() {
  const { id = "" } = useParams();
  const attempt = useQuery(attemptQueries.detail(id));
  return (
    <div>
      <BackLink />
      {attempt.isPending ? (
        <LoadingState label="Loading the attempt…" />
      ) : attempt.isError ? (
        attempt.error instanceof ApiError && attempt.error.status === 404 ? (
          <>
            <PageHeader title="Attempt not found" />
            <EmptyState title={`No attempt “${id}” that you may open`}>
              It does not exist, or it is not yours: instructors see the attempts of their own classes only. Check the link, or open the attempt from its class.
            </EmptyState>
          </>
        ) : (
          <>
            <PageHeader title={`Attempt ${id}`} />
            <ErrorState error={attempt.error} onRetry={() => attempt.refetch()} />
          </>
        )
      ) : (
        <AttemptView answer={attempt.data} />
      )}
    </div>
  );
}

/** Back to the list the attempt was opened from (its address travels in ?from=), else to the attempts list. */
function BackLink() {
  const location = useLocation();
  const [params] = useSearchParams();
  const to = inAppPath(params.get("from")) ?? inAppPath((location.state as { from?: string } | null)?.from) ?? "/attempts";
  return (
    <Link to={to} className="mb-3 inline-flex min-h-9 items-center gap-1 font-medium text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
      <span aria-hidden="true">←</span> {backLabel(to)}
    </Link>
  );
}

type History = AttemptDetailAnswer["scoreHistory"][number];

function AttemptView({ answer }: { answer: AttemptDetailAnswer }) {
  const { attempt, stream } = answer;
  const { unit } = useLengthUnit();
  const scoring = useScoringPolicy(attempt.policyVersion);
  const band = stream?.band ?? scoring.policy?.bands[attempt.profile] ?? null;
  const pausePolicy = scoring.policy ?? DEFAULT_POLICY;
  const series = useMemo(
    () => (stream ? compressionSeries(stream, stream.band, pausePolicy.pauseThresholdS, pausePolicy.longPauseLimitS) : null),
    [stream, pausePolicy.pauseThresholdS, pausePolicy.longPauseLimitS],
  );

  const historyColumns: Column<History>[] = [
    { key: "version", header: "Policy version", value: (h) => h.policyVersion, align: "right" },
    { key: "score", header: "Score", value: (h) => Math.round(h.score), align: "right" },
    { key: "passed", header: "Result", value: (h) => (h.passed ? "Passed" : "Not passed") },
    { key: "errors", header: "Errors", value: (h) => (h.errors.length ? h.errors.map(errorLabel).join("; ") : "None"), wrap: true },
    { key: "replacedAt", header: "Replaced on", value: (h) => h.replacedAt, render: (h) => formatDateTime(h.replacedAt) },
  ];

  const facts: [string, React.ReactNode][] = [
    ["Learner", <span className="font-mono">{attempt.learner}</span>],
    ["Started", formatRecordedDateTime(attempt.startedAt)],
    [
      "Class",
      <Link to={`/classes/${encodeURIComponent(attempt.classId)}`} className="text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
        {attempt.classId}
      </Link>,
    ],
    ["Site", attempt.site?.code ?? "Not recorded"],
    ["Instructor", attempt.instructor?.code ?? "Not recorded"],
    ["Manikin", attempt.manikin?.assetId ?? "Not recorded"],
    [dimensionNames.patientType, patientTypeNames[attempt.profile]],
    [dimensionNames.feedback, feedbackNames[attempt.feedback]],
    ["Data", attempt.source === "stream" ? "Compression stream" : "Device summary"],
  ];

  return (
    <>
      <PageHeader
        title={`Attempt ${attempt.id}`}
        description={`${patientTypeNames[attempt.profile]} manikin, ${formatRecordedDateTime(attempt.startedAt)}. Scored under policy version ${attempt.policyVersion}.`}
      />
      <div className="flex flex-col gap-6">
        <section aria-labelledby="result-heading" className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1.4fr)]">
          <div className="flex flex-col gap-3 rounded-card border border-line bg-surface p-4 shadow-card">
            <h2 id="result-heading" className="text-title">
              Result
            </h2>
            <div className="flex flex-wrap items-center gap-3">
              <p className="text-display tabular-nums">{Math.round(attempt.score)}</p>
              <div className="flex flex-col gap-1">
                <span className="text-small text-muted">Score out of 100 (mean of depth, rate and recoil on target)</span>
                <TargetBadge status={attempt.passed ? "on_target" : "too_low"} label={attempt.passed ? "Passed" : "Not passed"} className="self-start" />
              </div>
            </div>
            {attempt.errors.length > 0 ? (
              <div>
                <h3 className="text-small font-semibold">Why it did not pass</h3>
                <ul className="mt-1 list-disc pl-5">
                  {answer.errorLabels.map((e) => (
                    <li key={e.error}>{e.label}</li>
                  ))}
                </ul>
              </div>
            ) : !attempt.passed ? (
              <p>Too few compressions were recorded to judge this attempt.</p>
            ) : (
              <p>Every criterion of the pass rule was met.</p>
            )}
            <p className="text-small">
              Instructor’s own result:{" "}
              <strong>{attempt.instructorResult === null ? "not recorded" : attempt.instructorResult === "pass" ? "pass" : "fail"}</strong>
              {attempt.instructorResult !== null && (attempt.instructorResult === "pass") !== attempt.passed && " — differs from Quarterbeat’s"}
            </p>
            <p className="text-small text-muted">
              Scored under policy version {attempt.policyVersion}
              {scoring.known === "defaults" && " (the project defaults)"}. The pass rule is network policy, not a guideline.
            </p>
          </div>
          <dl className="grid grid-cols-[auto_1fr] content-start gap-x-4 gap-y-1 rounded-card border border-line bg-surface p-4 text-small shadow-card sm:grid-cols-[auto_1fr_auto_1fr]">
            {facts.map(([label, value]) => (
              <div key={label} className="contents">
                <dt className="text-muted">{label}</dt>
                <dd className="min-w-0 break-words font-medium">{value}</dd>
              </div>
            ))}
          </dl>
        </section>

        <section aria-labelledby="metrics-heading" className="flex flex-col gap-3">
          <h2 id="metrics-heading" className="text-title">
            Against the targets
          </h2>
          <SafetyNote compact />
          {scoring.pending ? (
            <LoadingState label="Loading the targets…" />
          ) : (
            <>
              {!scoring.policy && (
                <p className="text-small text-muted">
                  The pass marks of policy version {attempt.policyVersion} are not open to your role{band ? "; the target band shown is the one that version sets" : ""}.
                </p>
              )}
              <AttemptSummary attempt={attempt} band={band} policy={scoring.policy} unit={unit} />
            </>
          )}
        </section>

        <section aria-labelledby="stream-heading" className="flex flex-col gap-3">
          <h2 id="stream-heading" className="text-title">
            Compression by compression
          </h2>
          {stream && series && !agreesWithStored(series, attempt.metrics) && (
            <Notice tone="info">
              The figures above were measured when the attempt was imported; this chart classes each compression against the band of policy version {attempt.policyVersion}, which scored it later. Where the two bands differ, the counts here differ from the figures above.
            </Notice>
          )}
          {stream && series ? (
            <CompressionCharts
              series={series}
              band={stream.band}
              unit={unit}
              pauseThresholdS={pausePolicy.pauseThresholdS}
              longPauseLimitS={pausePolicy.longPauseLimitS}
              pauseNote={
                scoring.known === "version"
                  ? `Both limits are those of policy version ${attempt.policyVersion}.`
                  : scoring.known === "defaults"
                    ? "Both limits are the project defaults of version 1."
                    : `The limits of policy version ${attempt.policyVersion} are not open to your role; the project defaults are used here.`
              }
            />
          ) : (
            <EmptyState title="No compression stream for this attempt">
              The manikin sent a summary only, so there is nothing to show compression by compression; the figures above come from that summary.
            </EmptyState>
          )}
        </section>

        <section aria-labelledby="history-heading" className="flex flex-col gap-3">
          <h2 id="history-heading" className="text-title">
            Score history
          </h2>
          {answer.scoreHistory.length === 0 ? (
            <p className="text-muted">This attempt has only been scored once, under policy version {attempt.policyVersion}.</p>
          ) : (
            <>
              <p className="text-small text-muted">
                Now: version {attempt.policyVersion}, score {Math.round(attempt.score)}, {attempt.passed ? "passed" : "not passed"}. Earlier scores, kept when the attempt was scored again under a newer policy:
              </p>
              <DataTable caption="Earlier scores" captionHidden columns={historyColumns} rows={answer.scoreHistory} rowKey={(h) => h.policyVersion} filterable={false} exportFileName={`attempt-${attempt.id}-score-history`} />
            </>
          )}
        </section>
      </div>
    </>
  );
}

/** Whether the stream, classed against the band shown, gives the stored depth and recoil shares (to half a point). */
function agreesWithStored(series: CompressionSeries, metrics: AttemptDetailAnswer["attempt"]["metrics"]): boolean {
  const n = series.points.length;
  if (n === 0) return true;
  const close = (a: number, b: number) => Math.abs(a - b) <= 0.5;
  return close((100 * series.counts.onTarget) / n, metrics.depthOkPct) && close((100 * series.counts.recoilFull) / n, metrics.recoilOkPct);
}
