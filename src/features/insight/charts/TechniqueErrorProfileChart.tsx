// My error profile against the network's: for each kind of error, the share of my attempts that showed it
// beside the share of all attempts in the network, as paired bars.
import * as Plot from "@observablehq/plot";
import { Link } from "react-router";
import type { StandingAnswer } from "../../../../shared/schemas/insight";
import type { AttemptError } from "../../../../shared/scoring/scoreAttempt";
import { Chart, type ChartSize } from "../../../components/Chart";
import type { Column } from "../../../components/DataTable";
import { ChartLegend, shapeSwatch } from "../ChartLegend";
import { ink, percentTick, shareAxisTop } from "../chartStyle";
import { formatPercent, formatPoints, percentValue, roundTo, suppressedText } from "../format";
import { errorShortNames } from "../../../../shared/vocabulary";

export type TechniqueErrorProfileRow = StandingAnswer["errorProfile"]["rows"][number];

export function describeTechniqueErrorProfile(rows: readonly TechniqueErrorProfileRow[], networkSuppressed: boolean, minCount: number): string {
  const mine = rows.filter((r) => r.mine !== null);
  if (mine.length === 0) return "You have no attempts in this period.";
  const top = [...mine].sort((a, b) => (b.mine ?? 0) - (a.mine ?? 0))[0];
  let text = `Your most common error is ${errorShortNames[top.error].toLowerCase()}, in ${formatPercent(top.mine)} of your attempts`;
  if (networkSuppressed) return `${text}. The network's figures are hidden (${suppressedText(minCount)}).`;
  text += top.network === null ? "." : ` (network: ${formatPercent(top.network)}).`;
  const worse = rows.filter((r) => r.mine !== null && r.network !== null && r.mine - r.network >= 0.05);
  const better = rows.filter((r) => r.mine !== null && r.network !== null && r.network - r.mine >= 0.05);
  if (worse.length) text += ` At least 5 points more often than the network: ${worse.map((r) => errorShortNames[r.error].toLowerCase()).join(", ")}.`;
  if (better.length) text += ` At least 5 points less often: ${better.map((r) => errorShortNames[r.error].toLowerCase()).join(", ")}.`;
  return text;
}

/** `attemptsHref`, when given, makes each error a link to my attempts with it. */
export function techniqueErrorProfileColumns(
  networkSuppressed: boolean,
  minCount: number,
  attemptsHref?: (error: AttemptError) => string,
): Column<TechniqueErrorProfileRow>[] {
  return [
    {
      key: "label",
      header: "Error",
      value: (r) => r.label,
      wrap: true,
      render: (r) =>
        attemptsHref && r.mine ? (
          <Link to={attemptsHref(r.error)} className="text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
            {r.label}
          </Link>
        ) : (
          r.label
        ),
    },
    { key: "mine", header: "Your attempts (%)", value: (r) => percentValue(r.mine), render: (r) => formatPercent(r.mine), align: "right" },
    {
      key: "network",
      header: "Network attempts (%)",
      value: (r) => percentValue(r.network),
      render: (r) => (networkSuppressed ? suppressedText(minCount) : formatPercent(r.network)),
      align: "right",
    },
    {
      key: "difference",
      header: "Difference (points)",
      value: (r) => (r.mine === null || r.network === null ? null : roundTo((r.mine - r.network) * 100, 1)),
      render: (r) => (r.mine === null || r.network === null ? "–" : formatPoints(r.mine - r.network)),
      align: "right",
    },
  ];
}

const plot = (rows: readonly TechniqueErrorProfileRow[], { width }: ChartSize): Plot.PlotOptions => {
  const long = rows.flatMap((r) => [
    { name: errorShortNames[r.error], who: "You", share: r.mine },
    { name: errorShortNames[r.error], who: "Network", share: r.network },
  ]);
  const shown = long.filter((d) => d.share !== null);
  return {
    height: rows.length * 50 + 50,
    marginLeft: 128,
    marginRight: 48,
    marginBottom: 44,
    x: {
      domain: [
        0,
        shareAxisTop(
          shown.map((d) => d.share),
          0.2,
        ),
      ],
      tickFormat: percentTick,
      label: "Share of attempts with this error",
      labelAnchor: "center",
      labelOffset: 38,
      grid: true,
      ticks: width < 420 ? 4 : 8,
    },
    fy: { domain: rows.map((r) => errorShortNames[r.error]), label: null },
    y: { domain: ["You", "Network"], axis: null, paddingInner: 0.1 },
    marks: [
      Plot.barX(shown, {
        x: "share",
        y: "who",
        fy: "name",
        fill: (d: { who: string }) => (d.who === "You" ? ink.accent : ink.main),
        stroke: (d: { who: string }) => (d.who === "You" ? ink.text : "none"),
      }),
      Plot.text(shown, {
        x: "share",
        y: "who",
        fy: "name",
        text: (d: { who: string; share: number }) => `${d.who === "You" ? "you" : "net"} ${formatPercent(d.share)}`,
        dx: 4,
        textAnchor: "start",
        fill: ink.text,
        fontSize: 11,
      }),
      Plot.ruleX([0]),
    ],
  };
};

export function TechniqueErrorProfileChart({
  rows,
  networkSuppressed,
  minCount,
  attemptsHref,
}: {
  rows: readonly TechniqueErrorProfileRow[];
  networkSuppressed: boolean;
  minCount: number;
  attemptsHref?: (error: AttemptError) => string;
}) {
  return (
    <Chart
      title="Your errors against the network's"
      description={describeTechniqueErrorProfile(rows, networkSuppressed, minCount)}
      data={rows}
      columns={techniqueErrorProfileColumns(networkSuppressed, minCount, attemptsHref)}
      rowKey={(r) => r.error}
      plot={plot}
      exportFileName="error-profile"
      legend={
        <ChartLegend
          items={[
            { label: "Your attempts", swatch: shapeSwatch("bar", ink.accent, ink.text) },
            { label: networkSuppressed ? `Network (hidden: ${suppressedText(minCount)})` : "Network", swatch: shapeSwatch("bar", ink.main) },
          ]}
        />
      }
    />
  );
}
