// Lungs replaced, mouthpiece cleans and batteries replaced per 100 learners, by site, over the period: from
// the class logs (the equipment log records the same work per manikin, so it is not added). One small chart per consumable, each on its own scale
// (cleans run to hundreds per 100 learners, lungs to a handful).
import * as Plot from "@observablehq/plot";
import { useMemo } from "react";
import type { EquipmentAnswer } from "../../../shared/schemas/equipment";
import { Chart, type ChartSize } from "../../components/Chart";
import type { Column } from "../../components/DataTable";
import { EmptyState } from "../../components/States";
import { dusk } from "../../styles/palette";
import { Y_TITLE_MARGIN_TOP } from "../insight/charts/axisSpace";

export interface ConsumablesBySite {
  site: string;
  learners: number;
  lungs: number;
  mouthpieces: number;
  batteries: number;
}

type Item = "lungs" | "mouthpieces" | "batteries";

const items: readonly { key: Item; title: string; noun: string }[] = [
  { key: "lungs", title: "Lungs replaced", noun: "lungs replaced" },
  { key: "mouthpieces", title: "Mouthpiece cleans", noun: "mouthpiece cleans" },
  { key: "batteries", title: "Batteries replaced", noun: "batteries replaced" },
];

export const per100 = (total: number, learners: number) => (learners === 0 ? null : Math.round((1000 * total) / learners) / 10);

/** Sums each site's quarters of the period. */
export function consumablesBySite(rows: EquipmentAnswer["consumables"]): ConsumablesBySite[] {
  const bySite = new Map<string, ConsumablesBySite>();
  for (const row of rows) {
    const current = bySite.get(row.site.code) ?? { site: row.site.code, learners: 0, lungs: 0, mouthpieces: 0, batteries: 0 };
    current.learners += row.learners;
    current.lungs += row.lungs.total;
    current.mouthpieces += row.mouthpieces.total;
    current.batteries += row.batteries.total;
    bySite.set(row.site.code, current);
  }
  return [...bySite.values()].sort((a, b) => a.site.localeCompare(b.site));
}

function columnsFor(key: Item, title: string): Column<ConsumablesBySite>[] {
  return [
    { key: "site", header: "Site", value: (r) => r.site },
    { key: "learners", header: "Learners", value: (r) => r.learners, align: "right" },
    { key, header: title, value: (r) => r[key], align: "right" },
    { key: "per100", header: "Per 100 learners", value: (r) => per100(r[key], r.learners), align: "right" },
  ];
}

function plotFor(key: Item) {
  return (data: readonly ConsumablesBySite[], { width }: ChartSize): Plot.PlotOptions => {
    const rows = (data as ConsumablesBySite[]).map((r) => ({ site: r.site, value: per100(r[key], r.learners) }));
    const highest = Math.max(0, ...rows.map((r) => r.value ?? 0));
    return {
      height: 220,
      marginTop: Y_TITLE_MARGIN_TOP,
      marginLeft: 44,
      x: { label: null, tickRotate: width < 260 ? -30 : 0 },
      // headroom above the tallest bar for its value
      y: { label: "Per 100 learners", grid: true, nice: true, domain: [0, highest > 0 ? highest * 1.15 : 1] },
      marks: [
        Plot.barY(rows, { x: "site", y: "value", fill: dusk[600] }),
        Plot.text(rows, { x: "site", y: "value", text: (r: { value: number | null }) => (r.value === null ? "–" : String(r.value)), dy: -7, fill: "#1C1B2E" }),
        Plot.ruleY([0]),
      ],
    };
  };
}

const plots = { lungs: plotFor("lungs"), mouthpieces: plotFor("mouthpieces"), batteries: plotFor("batteries") };

export function ConsumablesCharts({ rows, period }: { rows: EquipmentAnswer["consumables"]; period: string }) {
  const data = useMemo(() => consumablesBySite(rows), [rows]);
  const withLearners = data.filter((r) => r.learners > 0);
  if (data.length === 0) {
    return <EmptyState title={`No consumables recorded in ${period}`}>The class logs of the period fill these charts.</EmptyState>;
  }
  return (
    <div className="grid gap-4 lg:grid-cols-3">
      {items.map(({ key, title, noun }) => {
        const sorted = [...withLearners].sort((a, b) => (per100(b[key], b.learners) ?? 0) - (per100(a[key], a.learners) ?? 0));
        const high = sorted[0];
        const low = sorted[sorted.length - 1];
        const description =
          withLearners.length === 0
            ? `No learners logged in ${period}.`
            : sorted.length === 1
              ? `${high.site}: ${per100(high[key], high.learners)} ${noun} per 100 learners in ${period}.`
              : `${title} per 100 learners in ${period}: most at ${high.site} (${per100(high[key], high.learners)}), fewest at ${low.site} (${per100(low[key], low.learners)}).`;
        return (
          <Chart
            key={key}
            title={title}
            description={description}
            data={data}
            columns={columnsFor(key, title)}
            rowKey={(r) => r.site}
            plot={plots[key]}
            exportFileName={`${key}-per-100-learners`}
          />
        );
      })}
    </div>
  );
}
