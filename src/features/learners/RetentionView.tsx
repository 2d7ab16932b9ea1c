// Skill retention: first-attempt pass rates of learners back for recertification, by months since their
// previous class, beside first-timers — as interval bars and as a table.
import type { RetentionAnswer, RetentionBin } from "../../../shared/schemas/learners";
import { patientTypeNames, retentionFigureName, retentionGroupNames } from "../../../shared/vocabulary";
import { rangeLabel } from "../../../shared/period";
import { Chart } from "../../components/Chart";
import { DataTable, type Column } from "../../components/DataTable";
import { intervalBarsPlot, type IntervalBar } from "../insight/charts/intervalPlot";
import { formatCount, formatInterval, formatPercent, percentValue } from "../insight/format";

interface RetentionRow {
  key: RetentionBin | "first_time";
  group: string;
  learners: number;
  passed: number;
  rate: number | null;
  low: number | null;
  high: number | null;
}

export function retentionRows(answer: RetentionAnswer): RetentionRow[] {
  const row = (key: RetentionRow["key"], group: string, g: RetentionAnswer["first_time"]): RetentionRow => ({
    key,
    group,
    learners: g.learners,
    passed: g.passed,
    rate: g.rate,
    low: g.ci95?.[0] ?? null,
    high: g.ci95?.[1] ?? null,
  });
  return [
    row("first_time", retentionGroupNames.first_time, answer.first_time),
    ...answer.returning.map((b) => row(b.months, retentionGroupNames[b.months], b)),
  ];
}

// On a phone the full group names do not fit beside the bars.
const shortGroupLabels: Record<RetentionBin | "first_time", string> = {
  first_time: "First course",
  "0-6": "0–6 months",
  "6-12": "6–12 months",
  "12-18": "12–18 months",
  "18-24": "18–24 months",
  "24+": "24+ months",
};

const columns: Column<RetentionRow>[] = [
  { key: "group", header: "Learners", value: (r) => r.group, primary: true },
  { key: "learners", header: "Learner–class pairs", value: (r) => r.learners, render: (r) => formatCount(r.learners), align: "right" },
  { key: "passed", header: "First attempt passed", value: (r) => r.passed, render: (r) => formatCount(r.passed), align: "right" },
  { key: "rate", header: retentionFigureName, value: (r) => percentValue(r.rate), render: (r) => formatPercent(r.rate), align: "right" },
  { key: "interval", header: "95 % interval (Wilson)", value: (r) => formatInterval(r.low, r.high), align: "right" },
];

export function RetentionView({ answer }: { answer: RetentionAnswer }) {
  const rows = retentionRows(answer);
  const returning = rows.slice(1).filter((r) => r.learners > 0);
  const bars: IntervalBar[] = rows
    .filter((r) => r.learners > 0)
    .map((r) => ({ label: r.group, shortLabel: shortGroupLabels[r.key], rate: r.rate, low: r.low, high: r.high }));
  const about = answer.profile ? ` on ${patientTypeNames[answer.profile].toLowerCase()} attempts` : "";
  const description =
    returning.length === 0
      ? `No learner came back for another class in ${rangeLabel(answer.period)}; ${formatCount(answer.first_time.learners)} learners took their first course.`
      : `${retentionFigureName}${about}, ${rangeLabel(answer.period)}: ${returning.map((r) => `${r.group.toLowerCase()} ${formatPercent(r.rate)} of ${formatCount(r.learners)}`).join("; ")}; first course ${formatPercent(answer.first_time.rate)} of ${formatCount(answer.first_time.learners)}. Bars show the rate, whiskers its 95 % interval.`;
  return (
    <div className="flex flex-col gap-6">
      <Chart
        title={`${retentionFigureName} by time since the previous class`}
        description={description}
        data={bars}
        columns={barColumns}
        rowKey={(b) => b.label}
        plot={(data, size) => intervalBarsPlot(data, size, 200)}
        exportFileName="retention-chart"
      />
      <DataTable caption="Returning and first-time learners" columns={columns} rows={rows} rowKey={(r) => r.key} exportFileName="retention" />
    </div>
  );
}

const barColumns: Column<IntervalBar>[] = [
  { key: "label", header: "Learners", value: (b) => b.label },
  { key: "rate", header: retentionFigureName, value: (b) => formatPercent(b.rate) },
  { key: "interval", header: "95 % interval", value: (b) => formatInterval(b.low, b.high) },
];
