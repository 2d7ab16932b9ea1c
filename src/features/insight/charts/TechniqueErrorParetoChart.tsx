// The error Pareto: how often each kind of error occurred, largest first, as bars of the share of all errors
// counted, with the running total as a line, so the few errors that make up most of the problem stand out.
import * as Plot from "@observablehq/plot";
import { useCallback, useMemo } from "react";
import { Link } from "react-router";
import type { z } from "zod";
import type { paretoRowSchema } from "../../../../shared/schemas/insight";
import { Chart, type ChartSize } from "../../../components/Chart";
import type { Column } from "../../../components/DataTable";
import { ChartLegend, lineSwatch, shapeSwatch } from "../ChartLegend";
import { ink, percentTick } from "../chartStyle";
import { formatCount, formatPercent, percentValue } from "../format";
import { errorShortNames } from "../../../../shared/vocabulary";

export type ParetoRow = z.infer<typeof paretoRowSchema>;

/** The first errors whose running total reaches 80 %: the "vital few". */
export function vitalFew(rows: readonly ParetoRow[]): ParetoRow[] {
  const few: ParetoRow[] = [];
  for (const row of rows) {
    if (row.count === 0) break;
    few.push(row);
    if (row.cumulativeShare >= 0.8) break;
  }
  return few;
}

export function describePareto(rows: readonly ParetoRow[], attempts: number | null): string {
  const total = rows.reduce((sum, row) => sum + row.count, 0);
  if (total === 0) return `No errors were counted${attempts ? ` in ${formatCount(attempts)} attempts` : ""}.`;
  const few = vitalFew(rows);
  const last = few[few.length - 1];
  const named = few.map((row) => `${errorShortNames[row.error].toLowerCase()} (${formatPercent(row.share)})`).join(", ");
  const lead =
    few.length === 1
      ? `One kind of error makes up ${formatPercent(last.cumulativeShare)} of the ${formatCount(total)} errors counted: ${named}.`
      : `${few.length} kinds of error make up ${formatPercent(last.cumulativeShare)} of the ${formatCount(total)} errors counted: ${named}.`;
  const top = rows[0];
  return attempts
    ? `${lead} The most common, ${errorShortNames[top.error].toLowerCase()}, affected ${formatPercent(top.attemptShare)} of ${formatCount(attempts)} attempts.`
    : lead;
}

export const paretoColumns: Column<ParetoRow>[] = [
  { key: "label", header: "Error", value: (r) => r.label, wrap: true },
  { key: "count", header: "Times counted", value: (r) => r.count, align: "right" },
  { key: "share", header: "Share of errors (%)", value: (r) => percentValue(r.share), render: (r) => formatPercent(r.share), align: "right" },
  {
    key: "cumulative",
    header: "Running total (%)",
    value: (r) => percentValue(r.cumulativeShare),
    render: (r) => formatPercent(r.cumulativeShare),
    align: "right",
  },
  {
    key: "attempts",
    header: "Share of attempts (%)",
    value: (r) => percentValue(r.attemptShare),
    render: (r) => formatPercent(r.attemptShare),
    align: "right",
  },
];

const paretoPlot = (rows: readonly ParetoRow[], { width }: ChartSize, examineHref?: (row: ParetoRow) => string): Plot.PlotOptions => {
  const labelled = rows.map((row) => ({ ...row, name: errorShortNames[row.error] }));
  return {
    height: Math.max(220, rows.length * 38 + 60),
    marginLeft: 128,
    // room for half of the centred "100 %" tick label at the right end of the axis
    marginRight: 24,
    marginBottom: 44,
    x: {
      domain: [0, 1],
      tickFormat: percentTick,
      label: "Share of all errors counted",
      labelAnchor: "center",
      labelOffset: 38,
      grid: true,
      ticks: width < 700 ? 5 : 10,
    },
    y: { domain: labelled.map((row) => row.name), label: null, padding: 0.25 },
    marks: [
      Plot.barX(labelled, {
        x: "share",
        y: "name",
        fill: ink.main,
        title: (r: ParetoRow) => `${r.label}: ${r.count} (${formatPercent(r.share)})`,
        ...(examineHref ? { href: examineHref } : {}),
      }),
      // counts sit inside long bars (where the running-total line starts) and after short ones
      Plot.text(
        labelled.filter((r) => r.share >= 0.12),
        { x: "share", y: "name", text: (r: ParetoRow) => formatCount(r.count), dx: -6, textAnchor: "end", fill: "white", fontWeight: 600 },
      ),
      Plot.text(
        labelled.filter((r) => r.share < 0.12),
        { x: "share", y: "name", text: (r: ParetoRow) => formatCount(r.count), dx: 6, textAnchor: "start", fill: ink.text },
      ),
      Plot.line(labelled, { x: "cumulativeShare", y: "name", stroke: ink.accentDark, strokeWidth: 2 }),
      Plot.dot(labelled, { x: "cumulativeShare", y: "name", symbol: "square", r: 3.5, fill: ink.accentDark }),
      Plot.ruleX([0]),
    ],
  };
};

/** `examineHref`, for those who may drill down: each bar and table row opens the error's trend and breakdown. */
export function TechniqueErrorParetoChart({
  rows,
  attempts,
  title = "Which errors matter most",
  examineHref,
}: {
  rows: readonly ParetoRow[];
  attempts: number | null;
  title?: string;
  examineHref?: (row: ParetoRow) => string;
}) {
  const plot = useCallback((data: readonly ParetoRow[], size: ChartSize) => paretoPlot(data, size, examineHref), [examineHref]);
  const columns = useMemo<Column<ParetoRow>[]>(
    () =>
      examineHref
        ? [
            ...paretoColumns,
            {
              key: "examine",
              header: "Examine",
              value: () => null,
              sortable: false,
              exportable: false,
              render: (r) => (
                <Link
                  to={examineHref(r)}
                  aria-label={`Trend and breakdown of “${r.label}”`}
                  className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900"
                >
                  Trend and breakdown
                </Link>
              ),
            },
          ]
        : paretoColumns,
    [examineHref],
  );
  return (
    <Chart
      title={title}
      description={describePareto(rows, attempts)}
      data={rows}
      columns={columns}
      rowKey={(r) => r.error}
      plot={plot}
      exportFileName="errors-pareto"
      legend={
        <ChartLegend
          items={[
            { label: "Share of errors (number: times counted)", swatch: shapeSwatch("bar", ink.main) },
            {
              label: "Running total",
              swatch: (
                <>
                  {lineSwatch(ink.accentDark)}
                  <rect x="9" y="3" width="6" height="6" fill={ink.accentDark} />
                </>
              ),
            },
          ]}
        />
      }
    />
  );
}
