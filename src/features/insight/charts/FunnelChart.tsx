// Funnel plot: each pass rate against its number of attempts, inside limits that narrow as the number grows
// (95 % and 99.8 % limits around the network rate, widened by √φ when instructors are overdispersed). A small
// group far from the network rate can be chance; a large one cannot. Adjusted for case mix, each point sits at
// its adjusted rate and effective number of attempts, where the limits give its own z-score. Points outside
// the limits get a triangle (up or down) and their label, so the reading never depends on colour.
import { Y_TITLE_MARGIN_TOP } from "./axisSpace";
import * as Plot from "@observablehq/plot";
import { useCallback } from "react";
import type { z } from "zod";
import type { funnelCurvePointSchema } from "../../../../shared/schemas/insight";
import { scaledFunnelLimits } from "../../../../shared/stats";
import { Chart, type ChartSize } from "../../../components/Chart";
import type { Column } from "../../../components/DataTable";
import { ChartLegend, lineSwatch, shapeSwatch } from "../ChartLegend";
import { ink, percentTick } from "../chartStyle";
import {
  formatCount,
  formatFixed,
  formatInterval,
  formatPercent,
  funnelPositionShort,
  funnelPositionText,
  percentValue,
  roundTo,
  type FunnelPosition,
} from "../format";

export type FunnelCurvePoint = z.infer<typeof funnelCurvePointSchema>;

export interface FunnelUnit {
  key: string | number;
  /** Shown beside points outside the limits and in the table (an instructor code, or "You"). */
  label: string;
  /** Where the point sits along the funnel: its attempts, or its effective attempts when adjusted. */
  n: number;
  /** Attempts measured (shown in the table when n is an effective number). */
  attempts: number;
  successes: number;
  /** The rate drawn: as measured, or adjusted for case mix. */
  rate: number;
  /** (observed − expected) / √variance; null when nothing could vary. */
  z: number | null;
  position: FunnelPosition | null;
  /** The viewer's own point: drawn as a star and always labelled. */
  isMe?: boolean;
}

const outside = (u: FunnelUnit) => u.position !== null && u.position !== "inside";
const above = (u: FunnelUnit) => u.position === "above95" || u.position === "above998";
const outer = (u: FunnelUnit) => u.position === "above998" || u.position === "below998";

/** The limits at this unit's own number of attempts (the table states them; the curve is sampled). */
export function limitsAt(networkRate: number, n: number, scale = 1) {
  const limits = scaledFunnelLimits(networkRate, n, scale);
  return { inner: { low: limits.low95, high: limits.high95 }, outer: { low: limits.low998, high: limits.high998 } };
}

export function describeFunnel(units: readonly FunnelUnit[], networkRate: number | null, subject: string, adjusted = false): string {
  if (networkRate === null) return "The network rate is not available, so no limits can be drawn.";
  const out = units.filter(outside);
  const me = units.find((u) => u.isMe);
  const parts = [
    adjusted
      ? `Pass rate adjusted for case mix against effective number of attempts for ${subject}, with limits around the network rate of ${formatPercent(networkRate)}.`
      : `Pass rate against number of attempts for ${subject}, with limits around the network rate of ${formatPercent(networkRate)}.`,
  ];
  if (me)
    parts.push(`Your pass rate is ${formatPercent(me.rate)} over ${formatCount(me.attempts)} attempts: ${funnelPositionText(me.position).toLowerCase()}.`);
  if (!me || units.length > 1) {
    if (out.length === 0) parts.push("Every point is inside the 95 % limits: differences are within what chance gives.");
    else parts.push(`Outside the limits: ${out.map((u) => `${u.label}, ${funnelPositionShort[u.position!].toLowerCase()}`).join("; ")}.`);
  }
  return parts.join(" ");
}

export function funnelColumns(networkRate: number | null, unitHeader: string, scale = 1, adjusted = false): Column<FunnelUnit>[] {
  const limits = (u: FunnelUnit) => (networkRate === null ? null : limitsAt(networkRate, u.n, scale));
  return [
    { key: "label", header: unitHeader, value: (u) => u.label },
    { key: "attempts", header: "Attempts", value: (u) => u.attempts, render: (u) => formatCount(u.attempts), align: "right" },
    ...(adjusted
      ? [
          {
            key: "n",
            header: "Effective attempts",
            value: (u: FunnelUnit) => roundTo(u.n, 1),
            render: (u: FunnelUnit) => formatFixed(u.n, 1),
            align: "right" as const,
          },
        ]
      : []),
    {
      key: "rate",
      header: adjusted ? "Adjusted pass rate (%)" : "Pass rate (%)",
      value: (u) => percentValue(u.rate),
      render: (u) => formatPercent(u.rate),
      align: "right",
    },
    {
      key: "z",
      header: "z-score",
      value: (u) => (u.z === null ? null : roundTo(u.z, 2)),
      render: (u) => (u.z === null ? "–" : formatFixed(u.z, 2)),
      align: "right",
    },
    {
      key: "inner",
      header: "95 % limits here",
      value: (u) => {
        const l = limits(u);
        return l ? formatInterval(l.inner.low, l.inner.high) : null;
      },
      sortable: false,
      align: "right",
    },
    {
      key: "outer",
      header: "99.8 % limits here",
      value: (u) => {
        const l = limits(u);
        return l ? formatInterval(l.outer.low, l.outer.high) : null;
      },
      sortable: false,
      align: "right",
    },
    {
      key: "position",
      header: "Position",
      value: (u) => funnelPositionText(u.position),
      render: (u) => <PositionText position={u.position} short />,
    },
  ];
}

export function PositionText({ position, short = false }: { position: FunnelPosition | null; short?: boolean }) {
  const shape = position === null || position === "inside" ? "circle" : position.startsWith("above") ? "up" : "down";
  const strong = position === "above998" || position === "below998";
  return (
    <span className={`inline-flex items-center gap-1.5 ${position && position !== "inside" ? "font-semibold" : ""}`}>
      <svg viewBox="0 0 24 12" className="h-3 w-4 shrink-0" aria-hidden="true">
        {shape === "circle"
          ? shapeSwatch("circle", "white", ink.main)
          : shapeSwatch(shape, strong ? (shape === "up" ? ink.above : ink.below) : "white", shape === "up" ? ink.above : ink.below)}
      </svg>
      {short && position ? funnelPositionShort[position] : funnelPositionText(position)}
    </span>
  );
}

export interface FunnelChartProps {
  title: string;
  units: readonly FunnelUnit[];
  curve: readonly FunnelCurvePoint[];
  networkRate: number | null;
  /** What the limits were multiplied by (√φ when overdispersed, else 1). */
  scale: number;
  /** Points at adjusted rates and effective attempts (case mix) rather than as measured. */
  adjusted: boolean;
  /** "instructors", "your attempts": used in the description. */
  subject: string;
  unitHeader: string;
  exportFileName: string;
  /** Where a point leads (an instructor's page); without it the points are pictures only. */
  unitHref?: (unit: FunnelUnit) => string;
}

export function FunnelChart({ title, units, curve, networkRate, scale, adjusted, subject, unitHeader, exportFileName, unitHref }: FunnelChartProps) {
  const plot = useCallback(
    (rows: readonly FunnelUnit[], { width }: ChartSize): Plot.PlotOptions => {
      const nMax = Math.max(10, ...rows.map((u) => u.n), ...curve.map((c) => c.n));
      const others = rows.filter((u) => !u.isMe);
      const me = rows.filter((u) => u.isMe);
      const shapeOf = (u: FunnelUnit) => (outside(u) ? "triangle" : "circle");
      const colourOf = (u: FunnelUnit) => (outside(u) ? (above(u) ? ink.above : ink.below) : ink.main);
      const labelled = others.filter(outside);
      return {
        height: width < 500 ? 280 : 360,
        marginLeft: 48,
        marginRight: 44,
        marginTop: Y_TITLE_MARGIN_TOP,
        marginBottom: 44,
        x: {
          domain: [0, Math.ceil(nMax * 1.08)],
          label: adjusted ? "Effective number of attempts" : "Number of attempts",
          labelAnchor: "center",
          labelOffset: 38,
          grid: true,
          ticks: width < 420 ? 4 : 8,
        },
        y: { domain: [0, 1], tickFormat: percentTick, label: adjusted ? "Pass rate adjusted for case mix" : "Measured pass rate", grid: true },
        marks: [
          Plot.line(curve, { x: "n", y: "high998", stroke: ink.limit, strokeWidth: 1.5 }),
          Plot.line(curve, { x: "n", y: "low998", stroke: ink.limit, strokeWidth: 1.5 }),
          Plot.line(curve, { x: "n", y: "high95", stroke: ink.limit, strokeDasharray: "5 4" }),
          Plot.line(curve, { x: "n", y: "low95", stroke: ink.limit, strokeDasharray: "5 4" }),
          networkRate === null ? null : Plot.ruleY([networkRate], { stroke: ink.main, strokeWidth: 1.5 }),
          Plot.dot(others, {
            x: "n",
            y: "rate",
            symbol: shapeOf,
            rotate: (u: FunnelUnit) => (outside(u) && !above(u) ? 180 : 0),
            r: (u: FunnelUnit) => (outside(u) ? 7 : 4.5),
            fill: (u: FunnelUnit) => (outer(u) ? colourOf(u) : "white"),
            stroke: colourOf,
            strokeWidth: 2,
            title: (u: FunnelUnit) =>
              `${u.label}: ${formatPercent(u.rate)}${adjusted ? " adjusted" : ""}, ${u.attempts} attempts — ${funnelPositionText(u.position)}`,
            ...(unitHref ? { href: unitHref } : {}),
          }),
          Plot.text(labelled, {
            x: "n",
            y: "rate",
            text: "label",
            dx: 10,
            textAnchor: "start",
            fill: ink.text,
            fontWeight: 600,
            stroke: "white",
            strokeWidth: 3,
            paintOrder: "stroke",
          } as Plot.TextOptions),
          Plot.dot(me, { x: "n", y: "rate", symbol: "star", r: 9, fill: ink.accent, stroke: ink.text, strokeWidth: 1.5 }),
          Plot.text(me, {
            x: "n",
            y: "rate",
            text: () => "You",
            dx: 12,
            textAnchor: "start",
            fill: ink.text,
            fontWeight: 700,
            stroke: "white",
            strokeWidth: 3,
            paintOrder: "stroke",
          } as Plot.TextOptions),
        ],
      };
    },
    [curve, networkRate, adjusted, unitHref],
  );

  const hasMe = units.some((u) => u.isMe);
  const hasOthers = units.some((u) => !u.isMe);
  return (
    <Chart
      title={title}
      description={describeFunnel(units, networkRate, subject, adjusted)}
      data={units}
      columns={funnelColumns(networkRate, unitHeader, scale, adjusted)}
      rowKey={(u) => u.key}
      plot={plot}
      exportFileName={exportFileName}
      legend={
        <ChartLegend
          items={[
            { label: "Network rate", swatch: lineSwatch(ink.main) },
            { label: scale > 1 ? "95 % limits, widened" : "95 % limits", swatch: lineSwatch(ink.limit, "5 4", 1.5) },
            { label: scale > 1 ? "99.8 % limits, widened" : "99.8 % limits", swatch: lineSwatch(ink.limit, undefined, 1.5) },
            ...(hasMe ? [{ label: "You", swatch: shapeSwatch("star", ink.accent, ink.text) }] : []),
            ...(hasOthers
              ? [
                  { label: "Inside the limits", swatch: shapeSwatch("circle", "white", ink.main) },
                  { label: "Above (hollow: 95 %, filled: 99.8 %)", swatch: shapeSwatch("up", ink.above) },
                  { label: "Below (hollow: 95 %, filled: 99.8 %)", swatch: shapeSwatch("down", ink.below) },
                ]
              : []),
          ]}
        />
      }
    />
  );
}
