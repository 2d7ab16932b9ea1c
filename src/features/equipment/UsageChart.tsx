// Compressions per quarter on the fleet, stacked by site; the table lists every manikin's attempts and
// compressions per quarter. Quarters hidden from the viewer (too few others' attempts) are left out.
import { formatCount } from "../../lib/formatting";
import * as Plot from "@observablehq/plot";
import { useMemo } from "react";
import type { EquipmentAnswer } from "../../../shared/schemas/equipment";
import { Chart, type ChartSize } from "../../components/Chart";
import type { Column } from "../../components/DataTable";
import { chartSeries } from "../../styles/palette";
import { quarterLabel } from "../../../shared/period";

interface UsageRow {
  key: string;
  assetId: string;
  site: string;
  quarter: string;
  attempts: number;
  compressions: number;
}

const columns: Column<UsageRow>[] = [
  { key: "assetId", header: "Asset id", value: (r) => r.assetId },
  { key: "site", header: "Site", value: (r) => r.site },
  { key: "quarter", header: "Quarter", value: (r) => r.quarter },
  { key: "attempts", header: "Attempts", value: (r) => r.attempts, align: "right" },
  { key: "compressions", header: "Compressions", value: (r) => r.compressions, align: "right" },
];

function usagePlot(data: readonly UsageRow[], { width }: ChartSize): Plot.PlotOptions {
  const quarters = [...new Set(data.map((r) => r.quarter))].sort();
  return {
    height: 260,
    marginLeft: 60,
    marginBottom: width < 560 ? 50 : 36,
    x: { domain: quarters, tickFormat: quarterLabel, tickRotate: width < 560 ? -35 : 0, label: null },
    y: { label: "Compressions", grid: true, tickFormat: "s" },
    color: { legend: true, label: "Site", range: chartSeries },
    marks: [Plot.barY(data as UsageRow[], Plot.groupX({ y: "sum" }, { x: "quarter", y: "compressions", fill: "site", title: "site" })), Plot.ruleY([0])],
  };
}

export function UsageChart({ fleet }: { fleet: EquipmentAnswer["fleet"] }) {
  const rows = useMemo<UsageRow[]>(
    () =>
      fleet.flatMap((m) =>
        m.usage.flatMap((u) =>
          u.attempts === null || u.compressions === null
            ? []
            : [
                {
                  key: `${m.id}|${u.quarter}`,
                  assetId: m.assetId,
                  site: m.site?.code ?? "No site",
                  quarter: u.quarter,
                  attempts: u.attempts,
                  compressions: u.compressions,
                },
              ],
        ),
      ),
    [fleet],
  );
  const byQuarter = new Map<string, number>();
  for (const r of rows) byQuarter.set(r.quarter, (byQuarter.get(r.quarter) ?? 0) + r.compressions);
  const quarters = [...byQuarter.keys()].sort();
  const first = quarters[0];
  const last = quarters[quarters.length - 1];
  const description =
    quarters.length === 0
      ? "No use recorded."
      : `Compressions on these manikins per quarter, stacked by site: ${formatCount(byQuarter.get(first) ?? 0)} in ${quarterLabel(first)}, ${formatCount(byQuarter.get(last) ?? 0)} in ${quarterLabel(last)}. The table lists each manikin per quarter.`;
  return (
    <Chart
      title="Use per quarter"
      description={description}
      data={rows}
      columns={columns}
      rowKey={(r) => r.key}
      plot={usagePlot}
      exportFileName="manikin-use-per-quarter"
    />
  );
}
