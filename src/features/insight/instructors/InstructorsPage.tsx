// Instructors (coordinator, quality lead): every instructor's pass rate on the funnel plot and in a table,
// each linking to that instructor's page.
import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { useCallback } from "react";
import { Link, useSearchParams } from "react-router";
import type { InstructorsAnswer } from "../../../../shared/schemas/insight";
import { DataTable, type Column } from "../../../components/DataTable";
import { PageHeader } from "../../../components/PageHeader";
import { FunnelChart, PositionText, type FunnelUnit } from "../charts/FunnelChart";
import { formatCount, formatFixed, formatInterval, formatPercent, formatScore, funnelPositionText, percentValue, roundTo } from "../format";
import { quarterLabel } from "../../../../shared/period";
import { AdjustChoice, dispersionSentence } from "../AdjustChoice";
import { InsightFilters } from "../InsightFilters";
import { NoDataForFilters } from "../NoDataForFilters";
import { QueryStatus } from "../QueryStatus";
import { instructorsFilters, instructorsQuery } from "../pageRequests";
import type { InsightFilterState } from "../useInsightFilters";

type InstructorRow = InstructorsAnswer["instructors"][number];

export default function InstructorsPage() {
  return (
    <div>
      <PageHeader
        title="Instructors"
        description="Each instructor's measured pass rate, judged against what chance allows for their number of attempts and, by default, for the mix of patient types and feedback displays they teach."
      />
      <InsightFilters optional={instructorsFilters} label="Filter the instructors">
        {(state) => <InstructorsBody state={state} />}
      </InsightFilters>
    </div>
  );
}

function InstructorsBody({ state }: { state: InsightFilterState }) {
  const [params] = useSearchParams();
  const query = useQuery({ ...instructorsQuery(state.api, params), placeholderData: keepPreviousData });
  return (
    <QueryStatus query={query} loadingLabel={`Loading the instructors for ${quarterLabel(state.quarter)}…`} errorTitle="The instructors could not be loaded">
      {(answer) => (answer.instructors.length === 0 ? <NoDataForFilters state={state} /> : <InstructorsContent answer={answer} />)}
    </QueryStatus>
  );
}

function instructorColumns(search: string): Column<InstructorRow>[] {
  return [
    {
      key: "code",
      header: "Code",
      value: (r) => r.code,
      render: (r) => (
        <Link to={`/instructors/${r.id}${search}`} className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
          {r.code}
        </Link>
      ),
      primary: true,
    },
    { key: "name", header: "Name", value: (r) => r.name },
    { key: "site", header: "Site", value: (r) => r.site?.code ?? "" },
    { key: "classes", header: "Classes", value: (r) => r.classes, align: "right" },
    { key: "attempts", header: "Attempts", value: (r) => r.attempts, render: (r) => formatCount(r.attempts), align: "right" },
    {
      key: "rate",
      header: "Pass rate (%)",
      headerWrap: true,
      value: (r) => percentValue(r.passRate.rate),
      render: (r) => formatPercent(r.passRate.rate),
      align: "right",
    },
    {
      key: "interval",
      header: "95 % interval",
      headerWrap: true,
      value: (r) => (r.passRate.low === null ? null : formatInterval(r.passRate.low, r.passRate.high)),
      sortable: false,
      align: "right",
    },
    {
      key: "median",
      header: "Median score",
      headerWrap: true,
      value: (r) => roundTo(r.medianScore, 1),
      render: (r) => formatScore(r.medianScore),
      align: "right",
    },
    {
      key: "expected",
      header: "Passes expected",
      headerWrap: true,
      value: (r) => roundTo(r.expected, 1),
      render: (r) => (r.expected === null ? "–" : formatFixed(r.expected, 1)),
      align: "right",
    },
    { key: "z", header: "z-score", value: (r) => roundTo(r.z, 2), render: (r) => (r.z === null ? "–" : formatFixed(r.z, 2)), align: "right" },
    {
      key: "position",
      header: "Funnel position",
      value: (r) => funnelPositionText(r.position),
      render: (r) => <PositionText position={r.position} short />,
      wrap: true,
    },
  ];
}

export function InstructorsContent({ answer }: { answer: InstructorsAnswer }) {
  const [params] = useSearchParams();
  const search = params.toString() ? `?${params.toString()}` : "";
  const adjusted = answer.funnel.adjust === "case-mix";
  // a point needs a place along the funnel: instructors whose strata never vary (z null) have none
  const units: FunnelUnit[] = answer.instructors
    .filter((r) => r.adjustedRate !== null && r.effectiveAttempts !== null && r.passRate.successes !== null)
    .map((r) => ({
      key: r.id,
      label: r.code,
      n: r.effectiveAttempts!,
      attempts: r.attempts,
      successes: r.passRate.successes!,
      rate: r.adjustedRate!,
      z: r.z,
      position: r.position,
    }));
  const outside = answer.instructors.filter((r) => r.position && r.position !== "inside");
  // each point opens that instructor's page with the same filters, like the table's link
  const unitHref = useCallback((unit: FunnelUnit) => `/instructors/${unit.key}${search}`, [search]);
  return (
    <div className="flex flex-col gap-6">
      <AdjustChoice />
      <div className="rounded-card border-l-4 border-marigold-500 bg-surface p-4 shadow-card">
        <p className="text-lead font-semibold">
          {answer.instructors.length} instructors in {quarterLabel(answer.period.from)}; network pass rate {formatPercent(answer.funnel.networkRate)}.
        </p>
        {outside.length === 0 ? (
          <p className="mt-1">Every instructor is inside the 95 % limits: their differences are within what chance gives.</p>
        ) : (
          <>
            <p className="mt-1">Outside the limits:</p>
            <ul className="mt-1 flex flex-col gap-1">
              {outside.map((r) => (
                <li key={r.id} className="flex flex-wrap items-center gap-x-2">
                  <Link to={`/instructors/${r.id}${search}`} className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
                    {r.code} · {r.name}
                  </Link>
                  <PositionText position={r.position} />
                  <span className="text-small text-muted tabular-nums">
                    {formatPercent(r.passRate.rate)} of {formatCount(r.attempts)} attempts
                  </span>
                </li>
              ))}
            </ul>
          </>
        )}
        <p className="mt-1 text-small text-muted">
          The funnel narrows as attempts add up: a small group far from the network rate can be chance, a large one rarely is. Outside the 95 % limits is worth
          a look; outside 99.8 % is very unlikely to be chance. {dispersionSentence(answer.funnel)}
        </p>
        {adjusted && (
          <p className="mt-1 text-small text-muted">
            Adjusted for case mix, each point sits at the network rate plus the instructor's passes beyond those expected, per attempt, and at the number of
            attempts whose limits match its z-score. The table lists the measured rates.
          </p>
        )}
      </div>
      <FunnelChart
        title={adjusted ? "Pass rate adjusted for case mix against effective attempts" : "Pass rate against number of attempts"}
        units={units}
        curve={answer.funnel.curve}
        networkRate={answer.funnel.networkRate}
        scale={answer.funnel.scale}
        adjusted={adjusted}
        subject="each instructor"
        unitHeader="Instructor"
        exportFileName={`instructor-funnel-${answer.period.from}`}
        unitHref={unitHref}
      />
      <DataTable
        caption="Instructors"
        columns={instructorColumns(search)}
        rows={answer.instructors}
        rowKey={(r) => r.id}
        exportFileName={`instructors-${answer.period.from}`}
        initialSort={{ key: "code", direction: "asc" }}
      />
    </div>
  );
}
