// The error Pareto: how often each error occurs, most frequent first, with the running share of all errors,
// so the few errors that make up most of the problem stand out.
import * as Plot from "@observablehq/plot";
import { useCallback } from "react";
import { Link } from "react-router";
import type { TechniqueErrorsAnswer } from "../../../shared/schemas/insight";
import { Chart, type ChartSize } from "../../components/Chart";
import type { Column } from "../../components/DataTable";
import { dusk, marigold } from "../../styles/palette";
import { percent, percentNumber, wholeNumber } from "../attempts/labels";
import { errorShortNames } from "../../../shared/vocabulary";

export type ParetoRow = TechniqueErrorsAnswer["pareto"]["rows"][number];

export interface ParetoChartProps {
  rows: readonly ParetoRow[];
  attempts: number;
  /** Link to examine one error (keeps the page's other parameters). */
  examineHref: (row: ParetoRow) => string;
  selected?: string | null;
}

function paretoPlot(data: readonly ParetoRow[], { width }: ChartSize, examineHref: (row: ParetoRow) => string): Plot.PlotOptions {
  const rows = data as ParetoRow[];
  const total = rows.reduce((sum, row) => sum + row.count, 0) || 1;
  const narrow = width < 560;
  const shareTicks = [0, 0.25, 0.5, 0.75, 1];
  return {
    height: narrow ? 320 : 300,
    marginBottom: narrow ? 90 : 40,
    marginRight: 48,
    marginTop: 28,
    x: { domain: rows.map((row) => row.error), tickFormat: (e: keyof typeof errorShortNames) => errorShortNames[e], tickRotate: narrow ? -40 : 0, label: null },
    y: { domain: [0, total], label: "Attempts with the error", grid: true, nice: false },
    marks: [
      Plot.barY(rows, { x: "error", y: "count", fill: dusk[600], title: (row: ParetoRow) => `${errorShortNames[row.error]}: ${row.count}`, href: examineHref }),
      // counts sit inside tall bars (the first bar's top is also the first point of the line) and above short ones
      Plot.text(rows, {
        x: "error",
        y: "count",
        text: (row: ParetoRow) => String(row.count),
        dy: 10,
        fill: "white",
        fontWeight: 600,
        filter: (row: ParetoRow) => row.count >= total * 0.08,
      }),
      Plot.text(rows, {
        x: "error",
        y: "count",
        text: (row: ParetoRow) => String(row.count),
        dy: -7,
        fill: "#1C1B2E",
        filter: (row: ParetoRow) => row.count < total * 0.08,
      }),
      Plot.line(rows, { x: "error", y: (row: ParetoRow) => row.cumulativeShare * total, stroke: marigold[700], strokeWidth: 2, marker: "circle" }),
      Plot.axisY({ anchor: "left", label: "Attempts with the error" }),
      Plot.axisY(
        shareTicks.map((s) => s * total),
        { anchor: "right", tickFormat: (v: number) => `${Math.round((v / total) * 100)} %`, label: "Cumulative share of errors", labelAnchor: "top" },
      ),
      Plot.ruleY([0]),
    ],
  };
}

export function ParetoChart({ rows, attempts, examineHref, selected }: ParetoChartProps) {
  // a bar opens its error's trend and breakdown, as the table's links do
  const plot = useCallback((data: readonly ParetoRow[], size: ChartSize) => paretoPlot(data, size, examineHref), [examineHref]);
  const top = rows.filter((row) => row.count > 0);
  const totalErrors = rows.reduce((sum, row) => sum + row.count, 0);
  const needed = top.findIndex((row) => row.cumulativeShare >= 0.8);
  const description =
    totalErrors === 0
      ? `No errors among ${wholeNumber(attempts)} attempts.`
      : `${wholeNumber(totalErrors)} errors in ${wholeNumber(attempts)} attempts. Bars: attempts with each error, most frequent first; line and right-hand axis: running share of all errors. ` +
        `The most frequent, ${errorShortNames[top[0].error].toLowerCase()}, is ${percent(top[0].share)} of all errors` +
        (needed >= 0 ? `; the first ${needed + 1} make up ${percent(top[needed].cumulativeShare)}.` : ".");

  const columns: Column<ParetoRow>[] = [
    { key: "error", header: "Error", value: (row) => row.label, wrap: true, primary: true },
    { key: "count", header: "Attempts with it", value: (row) => row.count, align: "right" },
    {
      key: "attemptShare",
      header: "Share of attempts (%)",
      value: (row) => percentNumber(row.attemptShare),
      render: (row) => percent(row.attemptShare),
      align: "right",
    },
    { key: "share", header: "Share of errors (%)", value: (row) => percentNumber(row.share), render: (row) => percent(row.share), align: "right" },
    {
      key: "cumulativeShare",
      header: "Cumulative share (%)",
      value: (row) => percentNumber(row.cumulativeShare),
      render: (row) => percent(row.cumulativeShare),
      align: "right",
    },
    {
      key: "examine",
      header: "Examine",
      value: () => null,
      sortable: false,
      exportable: false,
      render: (row) =>
        row.error === selected ? (
          <span className="text-small font-semibold text-muted">Shown below</span>
        ) : (
          <Link
            to={examineHref(row)}
            aria-label={`Trend and breakdown of “${row.label}”`}
            className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900"
          >
            Trend and breakdown
          </Link>
        ),
    },
  ];

  return (
    <Chart
      title="Errors, most frequent first"
      description={description}
      data={rows}
      columns={columns}
      rowKey={(row) => row.error}
      plot={plot}
      exportFileName="error-pareto"
    />
  );
}
