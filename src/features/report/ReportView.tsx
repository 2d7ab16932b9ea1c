// The funder report as a readable page: every figure comes with the text the API made for it (the same
// words as the PDF); suppressed counts read "fewer than 5" or "not shown", hidden rates "hidden", exactly as the
// API gives them.
import clsx from "clsx";
import type { ReactNode } from "react";
import type { ChangeVerdict, GroupResult, HiddenReason, ReportData } from "../../../shared/schemas/report";
import { FigureText, formatPoints, formatPointsSize, formatShare, formatWhole, hiddenReasons, rateWithInterval } from "./figures";
import { formatDateTime, formatDay } from "../../lib/formatting";
import { MethodsBox } from "./MethodsBox";
import { ReportTable } from "./ReportTable";
import { TrendChart } from "./TrendChart";
import { figureNames } from "../../../shared/vocabulary";

export interface ReportViewProps {
  data: ReportData;
  /** Where these figures come from (a stored version or today's data), shown under the title. */
  source?: ReactNode;
  /** Replaces the read-only "what the network is doing" text, e.g. with the coordinator's editor. */
  actionsSlot?: ReactNode;
}

function Section({ id, title, children, className }: { id: string; title: string; children: ReactNode; className?: string }) {
  return (
    <section aria-labelledby={id} className={clsx("flex flex-col gap-3 break-inside-avoid-page", className)}>
      <h3 id={id} className="text-title">
        {title}
      </h3>
      {children}
    </section>
  );
}

function Stat({ label, children, note }: { label: string; children: ReactNode; note?: ReactNode }) {
  return (
    <div className="flex flex-col rounded-card border border-line bg-surface p-3 shadow-card print:shadow-none">
      <dt className="text-small font-semibold text-muted">{label}</dt>
      <dd className="text-headline">{children}</dd>
      {note && <dd className="text-caption text-muted">{note}</dd>}
    </div>
  );
}

function VerdictMark({ verdict }: { verdict: ChangeVerdict | null }) {
  return (
    <svg viewBox="0 0 12 12" className="mt-1.5 size-3 shrink-0 text-dusk-700" aria-hidden="true">
      {verdict === "up" && <path d="M1 9.5h10L6 1z" fill="currentColor" />}
      {verdict === "down" && <path d="M1 2.5h10L6 11z" fill="currentColor" />}
      {(verdict === "no clear change" || verdict === null) && <path d="M1 6h10" stroke="currentColor" strokeWidth="2" />}
    </svg>
  );
}

const groupColumns = (first: string) => [
  { header: first, cell: (g: GroupResult) => g.label },
  { header: "Attempts", cell: (g: GroupResult) => <FigureText figure={g.attempts} />, align: "right" as const },
  { header: "Pass rate", cell: (g: GroupResult) => <FigureText figure={g.passRate} />, align: "right" as const },
  { header: "95 % interval", cell: (g: GroupResult) => (g.passRate.hidden ? "" : g.passRate.intervalText), align: "right" as const },
];

/** Says what "fewer than 5" and "not shown" mean, under a table that has such figures. */
function HiddenFiguresNote({ hidden }: { hidden: readonly (HiddenReason | null)[] }) {
  const reasons = new Set(hidden.filter((h): h is HiddenReason => h !== null));
  if (reasons.size === 0) return null;
  return (
    <ul className="text-caption text-muted">
      {reasons.has("small") && <li>“fewer than 5”: {hiddenReasons.small}</li>}
      {reasons.has("protects-other") && <li>“not shown”: {hiddenReasons["protects-other"]}</li>}
    </ul>
  );
}

function feedbackSentence(points: number, verdict: ChangeVerdict | null): string {
  if (Math.abs(points) < 0.05) return "The pass rate was the same with the display shown and hidden.";
  const chance = verdict === "no clear change" ? ", a difference small enough to be chance (the 95 % interval of the difference includes no difference)" : "";
  return `The pass rate with the display shown was ${formatPointsSize(points)} ${points > 0 ? "higher" : "lower"} than with it hidden${chance}.`;
}

export function ReportView({ data, source, actionsSlot }: ReportViewProps) {
  return (
    <article aria-labelledby="report-title" className="flex flex-col gap-8" data-report-article="">
      <header className="flex flex-col gap-1">
        <p className="text-small font-semibold tracking-wide text-dusk-700 uppercase">{data.networkName}</p>
        <h2 id="report-title" className="text-headline">
          Training quality report, {data.periodLabel}
        </h2>
        <p className="text-small text-muted">
          Period {data.period} · figures as of {formatDateTime(data.generatedAt)} · scoring policy version {data.policyVersion}
        </p>
        {source && <div className="mt-1 text-small">{source}</div>}
      </header>

      {!data.hasData ? (
        <div className="flex flex-col gap-2 rounded-card border border-dashed border-line-strong bg-surface p-6">
          <p className="text-lead font-semibold">Nothing to report for {data.periodLabel}</p>
          <p className="text-muted">No classes or measured attempts were recorded in this period. Choose another period above.</p>
        </div>
      ) : (
        <ReportSections data={data} actionsSlot={actionsSlot} />
      )}
    </article>
  );
}

function ReportSections({ data, actionsSlot }: { data: ReportData; actionsSlot?: ReactNode }) {
  return (
    <>
      <Section id="report-brief" title="In brief">
        {data.narrative.length === 0 ? (
          <p className="text-muted">There is nothing to summarise for this period.</p>
        ) : (
          <div className="flex max-w-3xl flex-col gap-2 text-lead">
            {data.narrative.map((paragraph, i) => (
              <p key={i}>{paragraph}</p>
            ))}
          </div>
        )}
      </Section>

      <Section id="report-reach" title="Reach">
        <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-5">
          <Stat label="Classes">
            <FigureText figure={data.reach.classes} />
          </Stat>
          <Stat label="Learners">
            <FigureText figure={data.reach.learners} />
          </Stat>
          <Stat label="Sites">
            <FigureText figure={data.reach.sites} />
          </Stat>
          <Stat label="Instructors">
            <FigureText figure={data.reach.instructors} />
          </Stat>
          <Stat label="Attempts measured">
            <FigureText figure={data.reach.attempts} />
          </Stat>
        </dl>
        {data.reach.byCourse.length > 0 && (
          <ReportTable
            caption="Classes and learners by course"
            rows={data.reach.byCourse}
            rowKey={(c) => c.key}
            columns={[
              { header: "Course", cell: (c) => c.label },
              { header: "Classes", cell: (c) => <FigureText figure={c.classes} />, align: "right" },
              { header: "Learners", cell: (c) => <FigureText figure={c.learners} />, align: "right" },
            ]}
          />
        )}
      </Section>

      <Section id="report-pass" title={figureNames.passRate}>
        <div className="flex flex-col gap-2 rounded-card border border-line bg-surface p-4 shadow-card print:shadow-none">
          <p className="text-small text-muted">Measured attempts that met every part of the network's pass rule (see “How these figures are made”).</p>
          <p className="flex flex-wrap items-baseline gap-x-3">
            <span className="text-display tabular-nums">
              <FigureText figure={data.passRate} />
            </span>
            {!data.passRate.hidden && data.passRate.intervalText && (
              <span className="text-lead text-muted tabular-nums">95 % interval {data.passRate.intervalText}</span>
            )}
          </p>
          <p className="text-small text-muted">
            of <FigureText figure={data.passRate.n} /> measured attempts
          </p>
          <p className="sr-only">Pass rate: {rateWithInterval(data.passRate)}</p>
          {data.comparisons.length > 0 && (
            <ul className="mt-2 flex flex-col gap-1 border-t border-line pt-3">
              {data.comparisons.map((comparison) => (
                <li key={comparison.period} className="flex items-start gap-2">
                  <VerdictMark verdict={comparison.verdict} />
                  <span>
                    {comparison.text}
                    {comparison.verdict === "no clear change" && comparison.changePoints !== null && (
                      <span className="text-muted"> ({formatPoints(comparison.changePoints)}, within what chance would give.)</span>
                    )}
                  </span>
                </li>
              ))}
            </ul>
          )}
        </div>
        {data.byPatientType.length > 0 && (
          <ReportTable caption="Pass rate by patient type" rows={data.byPatientType} rowKey={(g) => g.key} columns={groupColumns("Patient type")} />
        )}
      </Section>

      <Section id="report-trend" title="Quarter by quarter">
        <TrendChart trend={data.trend} />
      </Section>

      <Section id="report-errors" title="Most common errors">
        {data.errors.rows.length === 0 ? (
          <p className="text-muted">No errors were found in this period's measured attempts.</p>
        ) : (
          <>
            <p className="text-small text-muted">
              Attempts with at least one error: <FigureText figure={data.errors.attemptsWithErrors} />. An attempt can show more than one error.
            </p>
            <ReportTable
              caption="Most common errors"
              rows={data.errors.rows}
              rowKey={(e) => e.name}
              columns={[
                { header: "Error", cell: (e) => e.label },
                { header: "Attempts", cell: (e) => <FigureText figure={e.count} />, align: "right" },
                { header: "Share of errors found", cell: (e) => (e.share === null ? "" : formatShare(e.share)), align: "right" },
              ]}
            />
            <HiddenFiguresNote hidden={data.errors.rows.map((e) => e.count.hidden)} />
          </>
        )}
        <div className="flex flex-col gap-1 rounded-card border-l-4 border-marigold-500 bg-surface p-4 shadow-card print:shadow-none">
          <h4 className="font-semibold">What the network is doing about them</h4>
          {actionsSlot ??
            (data.errors.actions.trim() ? (
              <p className="whitespace-pre-wrap">{data.errors.actions}</p>
            ) : (
              <p className="text-muted">The coordinator has not written about this period yet.</p>
            ))}
        </div>
      </Section>

      {data.improvementActions && (
        <Section id="report-improvement-actions" title="Improvement actions">
          {data.improvementActions.length === 0 ? (
            <p className="text-muted">No improvement action had started by the end of the period.</p>
          ) : (
            <>
              <p className="text-small text-muted">
                What the network has changed to move one figure, where and from when. Actions aimed at a single instructor are not listed. A change after an
                action started is not proof that the action caused it.
              </p>
              <ReportTable
                caption="Improvement actions"
                rows={data.improvementActions}
                rowKey={(a) => `${a.startDate}-${a.title}`}
                columns={[
                  { header: "Action", cell: (a) => a.title },
                  { header: "Aim", cell: (a) => a.aim },
                  { header: "Where", cell: (a) => a.scope },
                  { header: "Start", cell: (a) => formatDay(a.startDate) },
                  { header: "Status", cell: (a) => a.status },
                ]}
              />
            </>
          )}
        </Section>
      )}

      <Section id="report-feedback" title="Live or hidden feedback display">
        <p className="text-small text-muted">
          Some attempts are made with the manikin's live display shown to the learner, others with it hidden, as in a real emergency.
        </p>
        <ReportTable
          caption="Pass rate with the display shown and hidden"
          rows={[data.feedback.live, data.feedback.hidden]}
          rowKey={(g) => g.key}
          columns={groupColumns("Display")}
        />
        {data.feedback.differencePoints !== null && <p>{feedbackSentence(data.feedback.differencePoints, data.feedback.verdict)}</p>}
      </Section>

      <Section id="report-agreement" title="Instructors' judgement and measured quality">
        <dl className="grid grid-cols-1 gap-3 sm:grid-cols-2 lg:grid-cols-4">
          <Stat label="Attempts with an instructor's pass or fail">
            <FigureText figure={data.agreement.pairs} />
          </Stat>
          <Stat label="Instructor and measurement agreed">
            <span className="tabular-nums">{formatShare(data.agreement.observedAgreement)}</span>
          </Stat>
          <Stat label="Agreement beyond chance (Cohen's kappa)" note="0 = no better than chance, 1 = full agreement">
            <span className="tabular-nums">{data.agreement.kappaText || "–"}</span>
          </Stat>
          <Stat
            label="Learners the instructors recorded as completing"
            note={
              <>
                {data.agreement.completionRate.intervalText && <>95 % interval {data.agreement.completionRate.intervalText}. </>}
                Learners who passed on the manikin at least once: {rateWithInterval(data.agreement.everPassedRate)}. Measured pass rate per attempt:{" "}
                {rateWithInterval(data.agreement.objectivePassRate)}.
              </>
            }
          >
            <FigureText figure={data.agreement.completionRate} />
          </Stat>
        </dl>
      </Section>

      <Section id="report-equipment" title="Equipment and consumables">
        <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4">
          <Stat label="Manikins used">
            <FigureText figure={data.equipment.manikinsUsed} />
          </Stat>
          <Stat label="Compressions recorded">
            <FigureText figure={data.equipment.compressions} />
          </Stat>
          <Stat label="Compressions per manikin">
            <span className="tabular-nums">{formatWhole(data.equipment.compressionsPerManikin)}</span>
          </Stat>
          <Stat label="Services">
            <FigureText figure={data.equipment.services} />
          </Stat>
          <Stat label="Faults reported">
            <FigureText figure={data.equipment.faults} />
          </Stat>
          <Stat label="Lungs replaced" note="per 100 learners">
            <FigureText figure={data.equipment.lungsPer100Learners} />
          </Stat>
          <Stat label="Mouthpieces cleaned" note="per 100 learners">
            <FigureText figure={data.equipment.mouthpiecesPer100Learners} />
          </Stat>
          <Stat label="Batteries replaced" note="per 100 learners">
            <FigureText figure={data.equipment.batteriesPer100Learners} />
          </Stat>
        </dl>
      </Section>

      <MethodsBox data={data} />
    </>
  );
}
