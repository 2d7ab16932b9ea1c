// The manikin fleet: where each manikin is, how much it was used in the period and since its last service,
// and whether a fault is open.
import { Link } from "react-router";
import type { EquipmentAnswer } from "../../../shared/schemas/equipment";
import { DataTable, type Column } from "../../components/DataTable";
import { formatCount, formatDay } from "../../lib/formatting";
import { patientTypeNames } from "../../../shared/vocabulary";
import { quarterLabel } from "../../../shared/period";

export type FleetRow = EquipmentAnswer["fleet"][number];

interface ShownFleetRow extends FleetRow {
  /** null when a quarter of the period is hidden from this viewer (too few others' attempts or instructors) */
  periodAttempts: number | null;
  periodCompressions: number | null;
  due: string[];
}

function sumOrHidden(values: readonly (number | null)[]): number | null {
  return values.some((value) => value === null) ? null : values.reduce<number>((sum, value) => sum + value!, 0);
}

export function FleetTable({ answer, manikinHref }: { answer: EquipmentAnswer; manikinHref?: (assetId: string) => string }) {
  const inPeriod = new Set(answer.period.quarters);
  const dueBy = new Map<number, string[]>();
  for (const item of answer.attention) {
    if (!item.manikin) continue;
    const words = item.kind === "open_fault" ? "Open fault" : "Service due";
    const list = dueBy.get(item.manikin.id) ?? [];
    if (!list.includes(words)) list.push(words);
    dueBy.set(item.manikin.id, list);
  }
  const rows: ShownFleetRow[] = answer.fleet.map((m) => ({
    ...m,
    periodAttempts: sumOrHidden(m.usage.filter((u) => inPeriod.has(u.quarter)).map((u) => u.attempts)),
    periodCompressions: sumOrHidden(m.usage.filter((u) => inPeriod.has(u.quarter)).map((u) => u.compressions)),
    due: dueBy.get(m.id) ?? [],
  }));
  const periodLabel = answer.period.from === answer.period.to ? quarterLabel(answer.period.from) : "period";
  const number = formatCount;
  const hiddenOr = (value: number | null) =>
    value === null ? (
      <span className="text-small text-muted italic" title="Hidden to protect colleagues: too few attempts or instructors other than you">
        Hidden
      </span>
    ) : (
      number(value)
    );
  const columns: Column<ShownFleetRow>[] = [
    {
      key: "assetId",
      header: "Asset id",
      value: (m) => m.assetId,
      primary: true,
      render: (m) =>
        manikinHref ? (
          <Link to={manikinHref(m.assetId)} className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
            {m.assetId}
          </Link>
        ) : (
          m.assetId
        ),
    },
    { key: "patientType", header: "Patient type", headerWrap: true, value: (m) => (m.patientType ? patientTypeNames[m.patientType] : null) },
    { key: "site", header: "Site", value: (m) => m.site?.code ?? null },
    {
      key: "attention",
      header: "Needs attention",
      wrap: true,
      headerWrap: true,
      value: (m) => m.due.join("; "),
      render: (m) =>
        m.due.length === 0 ? (
          <span className="text-muted">No</span>
        ) : (
          <span className="inline-flex items-center gap-1 font-semibold text-too-high-text">
            <svg viewBox="0 0 12 12" className="size-3" aria-hidden="true">
              <path d="M6 1 11 10.5H1z" fill="currentColor" />
            </svg>
            {m.due.join(", ")}
          </span>
        ),
    },
    {
      key: "periodAttempts",
      header: `Attempts, ${periodLabel}`,
      headerWrap: true,
      value: (m) => m.periodAttempts,
      render: (m) => hiddenOr(m.periodAttempts),
      align: "right",
    },
    {
      key: "periodCompressions",
      header: `Compressions, ${periodLabel}`,
      headerWrap: true,
      value: (m) => m.periodCompressions,
      render: (m) => hiddenOr(m.periodCompressions),
      align: "right",
    },
    {
      key: "sinceService",
      header: "Compressions since service",
      headerWrap: true,
      value: (m) => m.compressionsSinceService,
      render: (m) => number(m.compressionsSinceService),
      align: "right",
    },
    {
      key: "lastService",
      header: "Last service",
      headerWrap: true,
      value: (m) => m.lastServiceDate,
      render: (m) => (m.lastServiceDate ? formatDay(m.lastServiceDate) : <span className="text-muted">None recorded</span>),
    },
    { key: "openFaults", header: "Open faults", headerWrap: true, value: (m) => m.openFaults, align: "right" },
    // last: the least asked-for column, where a narrow screen cuts the table
    {
      key: "status",
      header: "In use since",
      headerWrap: true,
      wrap: true,
      value: (m) => (m.retiredOn ? `Retired ${m.retiredOn}` : (m.inServiceSince ?? "")),
      render: (m) =>
        m.retiredOn ? (
          <span className="text-muted">
            Retired <span className="whitespace-nowrap">{formatDay(m.retiredOn)}</span>
          </span>
        ) : m.inServiceSince ? (
          <span className="whitespace-nowrap">{formatDay(m.inServiceSince)}</span>
        ) : (
          <span className="text-muted">Not recorded</span>
        ),
    },
  ];
  return (
    <DataTable
      caption="Manikin fleet"
      columns={columns}
      rows={rows}
      rowKey={(m) => m.id}
      exportFileName="manikin-fleet"
      emptyMessage="No manikins match these filters."
      initialSort={{ key: "assetId", direction: "asc" }}
    />
  );
}
