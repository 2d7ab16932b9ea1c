// One attempt, led by the network's pass rule as a checklist (each criterion's value, pass mark and margin) and
// where the attempt sits among the network's attempts of its patient type and quarter; then the attempt's
// facts, its compressions where the manikin sent a stream, and any earlier scores.
import { useQuery } from "@tanstack/react-query";
import { useMemo } from "react";
import { Link, useLocation, useParams, useSearchParams } from "react-router";
import { quarterLabel } from "../../../shared/period";
import { DEFAULT_POLICY } from "../../../shared/scoring/policy";
import { MIN_COMPRESSIONS_TO_PASS } from "../../../shared/scoring/scoreAttempt";
import { formatLength } from "../../../shared/units";
import type { AttemptDetailAnswer } from "../../../shared/schemas/insight";
import { ApiError } from "../../api/http";
import { DataTable, type Column } from "../../components/DataTable";
import { PageHeader } from "../../components/PageHeader";
import { SafetyNote } from "../../components/SafetyNote";
import { Notice } from "../../components/Notice";
import { EmptyState, ErrorState, LoadingState } from "../../components/States";
import { CompressionOverview } from "./CompressionOverview";
import { NetworkPlacement } from "./NetworkPlacement";
import { criteriaOf, PassRuleChecklist } from "./PassRuleChecklist";
import { compressionSeries, type CompressionSeries } from "./compressionSeries";
import { errorLabel } from "./labels";
import { formatDateTime, formatRecordedDateTime } from "../../lib/formatting";
import { attemptQueries } from "./queries";
import { backLabel, inAppPath } from "./returnPath";
import { useLengthUnit } from "../../lib/useLengthUnit";
import { dimensionNames, feedbackNames, patientTypeNames } from "../../../shared/vocabulary";

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

const cardClass = "flex flex-col gap-3 rounded-card border border-line bg-surface p-4 shadow-card";

function AttemptView({ answer }: { answer: AttemptDetailAnswer }) {
  const { attempt, stream, scoring, placement } = answer;
  const { unit } = useLengthUnit();
  const m = attempt.metrics;
  const band = stream?.band ?? scoring?.band ?? null;
  const pauseLimits = scoring ?? DEFAULT_POLICY;
  const series = useMemo(
    () => (stream ? compressionSeries(stream, stream.band, pauseLimits.pauseThresholdS, pauseLimits.longPauseLimitS) : null),
    [stream, pauseLimits.pauseThresholdS, pauseLimits.longPauseLimitS],
  );
  const judged = m.compressions >= MIN_COMPRESSIONS_TO_PASS;
  const criteria = scoring ? criteriaOf(attempt, scoring.passRule) : null;
  const missed = criteria ? criteria.filter((c) => !c.met).length : attempt.errors.length;

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
    [
      "Instructor’s result",
      <>
        {attempt.instructorResult === null ? "Not recorded" : attempt.instructorResult === "pass" ? "Pass" : "Fail"}
        {attempt.instructorResult !== null && (attempt.instructorResult === "pass") !== attempt.passed && (
          <span className="font-normal text-muted"> (differs from the measurement)</span>
        )}
      </>,
    ],
  ];
  const noRate = m.compressions < 2 || (m.rateCpm === 0 && m.rateOkPct === 0);
  const measurements: [string, string][] = [
    ["Compressions", `${m.compressions} over ${m.durationS.toFixed(1)} s`],
    ["Mean depth", `${formatLength(m.depthMm, unit)}${band ? ` (band ${formatLength(band.depthMinMm, unit)} to ${formatLength(band.depthMaxMm, unit)})` : ""}`],
    ["Mean rate", noRate ? "–" : `${Math.round(m.rateCpm)} per minute${band ? ` (band ${band.rateMin}–${band.rateMax})` : ""}`],
    ["Pauses", m.pauses === null ? "Not recorded" : `${m.pauses}${m.pausesOver10s ? `, ${m.pausesOver10s} over 10 s` : ""}`],
  ];

  return (
    <>
      <PageHeader
        title={`Attempt ${attempt.id}`}
        description={`${patientTypeNames[attempt.profile]} manikin, ${formatRecordedDateTime(attempt.startedAt)}, learner ${attempt.learner}. Judged by the network’s pass rule of policy version ${attempt.policyVersion}.`}
      />
      <div className="flex flex-col gap-6">
        <section aria-labelledby="rule-heading" className={cardClass}>
          <div className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1">
            <h2 id="rule-heading" className="text-title">
              Pass rule
            </h2>
            <p id="rule-verdict" className="text-lead font-semibold">
              {attempt.passed
                ? "Passed: every criterion met"
                : !judged
                  ? "Not passed: too few compressions to judge"
                  : `Not passed: ${missed} of ${criteria?.length ?? 5} criteria missed`}
            </p>
          </div>
          <SafetyNote compact />
          {!judged && (
            <p>
              {m.compressions === 0 ? "No compressions were recorded" : "Only one compression was recorded; at least two are needed to judge the rate"}, so the
              attempt cannot pass whatever its shares.
            </p>
          )}
          {scoring ? (
            <PassRuleChecklist attempt={attempt} rule={scoring.passRule} band={band} placement={placement} unit={unit} />
          ) : (
            <>
              <Notice tone="info">
                Policy version {attempt.policyVersion}, which scored this attempt, is no longer stored, so its pass marks cannot be shown. The errors it found:
              </Notice>
              <ul className="list-disc pl-5">
                {answer.errorLabels.length === 0 ? <li>None</li> : answer.errorLabels.map((e) => <li key={e.error}>{e.label}</li>)}
              </ul>
            </>
          )}
          <p className="text-caption text-muted">
            The pass marks are the network’s policy (version {attempt.policyVersion}), not a guideline. “In the network” places each share among the network’s{" "}
            {patientTypeNames[attempt.profile].toLowerCase()} attempts of {quarterLabel(attempt.quarter)}.
          </p>
        </section>

        <div className="grid gap-6 lg:grid-cols-2">
          <section aria-labelledby="network-heading" className={cardClass}>
            <h2 id="network-heading" className="text-title">
              Among the network
            </h2>
            <NetworkPlacement placement={placement} score={attempt.score} />
          </section>
          <section aria-labelledby="facts-heading" className={cardClass}>
            <h2 id="facts-heading" className="text-title">
              The attempt
            </h2>
            <dl className="grid grid-cols-[auto_1fr] content-start gap-x-4 gap-y-1 text-small sm:grid-cols-[auto_1fr_auto_1fr]">
              {[...facts, ...measurements].map(([label, value]) => (
                <div key={label} className="contents">
                  <dt className="text-muted">{label}</dt>
                  <dd className="min-w-0 break-words font-medium">{value}</dd>
                </div>
              ))}
            </dl>
          </section>
        </div>

        <section aria-labelledby="stream-heading" className="flex flex-col gap-3">
          <h2 id="stream-heading" className="text-title">
            Compressions
          </h2>
          {stream && series && !agreesWithStored(series, attempt.metrics) && (
            <Notice tone="info">
              The pass rule above reads the figures measured when the attempt was imported; these charts class each compression against the band of policy
              version {attempt.policyVersion}, which scored it later. Where the two bands differ, the counts here differ from the figures above.
            </Notice>
          )}
          {stream && series ? (
            <CompressionOverview
              series={series}
              band={stream.band}
              unit={unit}
              pauseThresholdS={pauseLimits.pauseThresholdS}
              longPauseLimitS={pauseLimits.longPauseLimitS}
              pauseNote={
                scoring
                  ? `Both limits are those of policy version ${attempt.policyVersion}.`
                  : "Policy version " + attempt.policyVersion + " is no longer stored; the project defaults are used here."
              }
            />
          ) : (
            <EmptyState title="No compression stream for this attempt">
              The manikin sent a summary only, so there is nothing to show compression by compression; the pass rule above reads that summary.
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
                Now: version {attempt.policyVersion}, score {Math.round(attempt.score)}, {attempt.passed ? "passed" : "not passed"}. Earlier scores, kept when
                the attempt was scored again under a newer policy:
              </p>
              <DataTable
                caption="Earlier scores"
                captionHidden
                columns={historyColumns}
                rows={answer.scoreHistory}
                rowKey={(h) => h.policyVersion}
                filterable={false}
                exportFileName={`attempt-${attempt.id}-score-history`}
              />
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
