// What needs attention, each with its reason in words: services due by compressions or by days, open faults,
// and classes that logged fewer mouthpiece cleans than the policy asks.
import { Link } from "react-router";
import type { EquipmentAnswer } from "../../../shared/schemas/equipment";
import { DataTable, type Column } from "../../components/DataTable";

type Item = EquipmentAnswer["attention"][number];

export const attentionKindLabels: Record<Item["kind"], string> = {
  service_by_compressions: "Service due: compressions",
  service_by_days: "Service due: time",
  open_fault: "Fault not resolved",
  mouthpiece_cleaning: "Too few mouthpiece cleans",
};

export function AttentionList({
  items,
  linkClasses,
  manikinHref,
}: {
  items: readonly Item[];
  linkClasses: boolean;
  manikinHref?: (assetId: string) => string;
}) {
  const columns: Column<Item & { key: string }>[] = [
    { key: "kind", header: "What", value: (i) => attentionKindLabels[i.kind], primary: true },
    {
      key: "subject",
      header: "Manikin or class",
      value: (i) => i.manikin?.assetId ?? i.classId,
      render: (i) =>
        i.manikin ? (
          manikinHref ? (
            <Link to={manikinHref(i.manikin.assetId)} className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
              {i.manikin.assetId}
            </Link>
          ) : (
            i.manikin.assetId
          )
        ) : i.classId && linkClasses ? (
          <Link to={`/classes/${encodeURIComponent(i.classId)}`} className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
            {i.classId}
          </Link>
        ) : (
          i.classId
        ),
    },
    { key: "site", header: "Site", value: (i) => i.site?.code ?? null },
    { key: "reason", header: "Reason", value: (i) => i.reason, wrap: true },
  ];
  const rows = items.map((item, index) => ({ ...item, key: `${item.kind}|${item.manikin?.id ?? item.classId ?? index}|${index}` }));
  return (
    <DataTable
      caption="Due for attention"
      columns={columns}
      rows={rows}
      rowKey={(i) => i.key}
      exportFileName="equipment-attention"
      emptyMessage="Nothing needs attention."
    />
  );
}
