// Where one error happens: a small bar chart of its share in each group (with the 95 % interval, so small
// groups are not over-read) beside a sortable table whose rows lead to the matching attempts.
import * as Plot from "@observablehq/plot";
import { useCallback, useMemo } from "react";
import { Link } from "react-router";
import type { TechniqueErrorsAnswer } from "../../../shared/schemas/insight";
import { wilsonInterval } from "../../../shared/stats/wilson";
import { Chart, type ChartSize } from "../../components/Chart";
import { DataTable, type Column } from "../../components/DataTable";
import { dusk } from "../../styles/palette";
import { percent, percentNumber } from "../attempts/labels";

export type BreakdownRow = NonNullable<TechniqueErrorsAnswer["selected"]>["byProfile"][number];

/** The chart shows at most this many groups (those with the most attempts with the error); the table shows all. */
export const CHART_GROUPS = 15;

export interface BreakdownPanelProps {
  /** "patient type", "site"… */
  dimension: string;
  rows: readonly BreakdownRow[];
  /** The group's name as shown. */
  nameOf: (row: BreakdownRow) => string;
  /** Link to the attempts of this group with the error, or null when the group cannot be filtered on. */
  attemptsHref: (row: BreakdownRow) => string | null;
  /** The group's own page (a manikin's record), linked from its name; null for none. */
  recordHref?: (row: BreakdownRow) => string | null;
  errorLabel: string;
}

interface ShownRow extends BreakdownRow {
  name: string;
  low: number | null;
  high: number | null;
}

function breakdownPlot(data: readonly ShownRow[], { width }: ChartSize, attemptsHref: (row: BreakdownRow) => string | null): Plot.PlotOptions {
  const rows = data as ShownRow[];
  const longest = Math.max(4, ...rows.map((row) => row.name.length));
  return {
    height: Math.max(100, rows.length * 24 + 50),
    marginLeft: Math.min(width / 3, 14 + longest * 7),
    marginRight: 44,
    x: {
      domain: [0, Math.min(1, Math.max(0.1, ...rows.map((row) => row.high ?? row.share)) * 1.1)],
      tickFormat: (v: number) => `${Math.round(v * 100)} %`,
      label: "Share of attempts with the error",
      grid: true,
      ticks: width < 400 ? 3 : 5,
    },
    y: { domain: rows.map((row) => row.name), label: null },
    marks: [
      // a bar opens the group's attempts with the error, as the table's links do
      Plot.barX(rows, { y: "name", x: "share", fill: dusk[300], href: (row: ShownRow) => (row.count > 0 ? attemptsHref(row) : null) }),
      Plot.ruleY(rows, { y: "name", x1: "low", x2: "high", stroke: dusk[800], strokeWidth: 1.5 }),
      Plot.tickX(rows, { y: "name", x: "low", stroke: dusk[800] }),
      Plot.tickX(rows, { y: "name", x: "high", stroke: dusk[800] }),
      Plot.text(rows, { y: "name", x: "high", text: (row: ShownRow) => percent(row.share, 0), dx: 5, textAnchor: "start", fill: "#1C1B2E" }),
      Plot.ruleX([0]),
    ],
  };
}

export function BreakdownPanel({ dimension, rows, nameOf, attemptsHref, recordHref, errorLabel }: BreakdownPanelProps) {
  const shown = useMemo<ShownRow[]>(
    () =>
      rows.map((row) => {
        const interval = wilsonInterval(row.count, row.attempts);
        return { ...row, name: nameOf(row), low: interval?.[0] ?? null, high: interval?.[1] ?? null };
      }),
    [rows, nameOf],
  );
  const charted = useMemo(() => {
    const withAttempts = shown.filter((row) => row.attempts > 0);
    const kept = [...withAttempts].sort((a, b) => b.count - a.count || b.attempts - a.attempts).slice(0, CHART_GROUPS);
    return kept.sort((a, b) => b.share - a.share);
  }, [shown]);
  const groups = shown.filter((row) => row.attempts > 0).length;
  const plot = useCallback((data: readonly ShownRow[], size: ChartSize) => breakdownPlot(data, size, attemptsHref), [attemptsHref]);
  const capitalised = dimension[0].toUpperCase() + dimension.slice(1);
  const columns: Column<ShownRow>[] = [
    {
      key: "name",
      header: capitalised,
      value: (row) => row.name,
      primary: true,
      render: (row) => {
        const href = recordHref?.(row);
        return href ? (
          <Link to={href} className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
            {row.name}
          </Link>
        ) : (
          row.name
        );
      },
    },
    {
      key: "attemptsLink",
      header: "Drill down",
      value: () => null,
      sortable: false,
      exportable: false,
      render: (row) => {
        const href = attemptsHref(row);
        if (!href || row.count === 0) return <span className="text-small text-muted">{row.count === 0 ? "None with the error" : "Group not recorded"}</span>;
        return (
          <Link
            to={href}
            aria-label={`${row.count} attempt${row.count === 1 ? "" : "s"} with this error, ${dimension} ${row.name}`}
            className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900"
          >
            {row.count} attempt{row.count === 1 ? "" : "s"}
          </Link>
        );
      },
    },
    { key: "count", header: "With the error", value: (row) => row.count, align: "right" },
    { key: "attempts", header: "Attempts", value: (row) => row.attempts, align: "right" },
    { key: "share", header: "Share (%)", value: (row) => percentNumber(row.share), render: (row) => percent(row.share), align: "right" },
    { key: "low", header: "95 % interval from (%)", value: (row) => percentNumber(row.low), render: (row) => percent(row.low), align: "right" },
    { key: "high", header: "to (%)", value: (row) => percentNumber(row.high), render: (row) => percent(row.high), align: "right" },
  ];
  const top = charted[0];
  const bottom = charted[charted.length - 1];
  const description =
    charted.length === 0
      ? "No attempts."
      : charted.length === 1
        ? `All attempts are in ${top.name}: ${percent(top.share)} have the error.`
        : `Share of attempts with “${errorLabel.toLowerCase()}” by ${dimension}, with 95 % intervals. Highest ${top.name} (${percent(top.share)} of ${top.attempts}), lowest ${bottom.name} (${percent(bottom.share)} of ${bottom.attempts}).` +
          (groups > charted.length
            ? ` The chart shows the ${charted.length} ${dimension}s with the most attempts with the error; the table lists all ${groups}.`
            : "");

  return (
    <div className="flex min-w-0 flex-col gap-4">
      <Chart
        title={`By ${dimension}`}
        description={description}
        data={charted}
        columns={columns.filter((c) => c.key !== "attemptsLink")}
        rowKey={(row) => row.key}
        plot={plot}
        exportFileName={`error-by-${dimension.replace(/\s+/g, "-")}-chart`}
      />
      <DataTable
        caption={`Attempts with the error by ${dimension}`}
        columns={columns}
        rows={shown}
        rowKey={(row) => row.key}
        initialSort={{ key: "count", direction: "desc" }}
        filterable={shown.length > 8}
        exportFileName={`error-by-${dimension.replace(/\s+/g, "-")}`}
      />
    </div>
  );
}
