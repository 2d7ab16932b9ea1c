// Every saved version of the policy, newest first, with its date, its note and what it changed.
import type { LengthUnit } from "../../../shared/units";
import { DataTable, type Column } from "../../components/DataTable";
import { formatDateTime } from "../../lib/formatting";
import { changedFields, displayValue, readPath, unitWord } from "./policyFields";
import type { PolicyVersionRow } from "./queries";

interface VersionRow extends PolicyVersionRow {
  changes: string;
}

export function VersionList({ versions, unit, inForce }: { versions: readonly PolicyVersionRow[]; unit: LengthUnit; inForce: number }) {
  const byVersion = new Map(versions.map((v) => [v.version, v]));
  const rows: VersionRow[] = versions.map((v) => {
    const previous = byVersion.get(v.version - 1);
    if (!previous) return { ...v, changes: "First version" };
    const fields = changedFields(previous.policy, v.policy);
    const show = (path: string, field: Parameters<typeof displayValue>[0], policy: PolicyVersionRow["policy"]) => {
      const word = unitWord(field.kind, unit);
      return `${displayValue(field, readPath(policy, path), unit)}${word ? ` ${word}` : ""}`;
    };
    const describe = (field: (typeof fields)[number]) => {
      const where = field.path.startsWith("bands.")
        ? `${field.path.split(".")[1]} `
        : field.path.startsWith("passRule.")
          ? "pass rule: "
          : field.path.startsWith("equipment.")
            ? "equipment: "
            : "";
      return `${where}${field.label.toLowerCase()} ${show(field.path, field, previous.policy)} → ${show(field.path, field, v.policy)}`;
    };
    return { ...v, changes: fields.length === 0 ? "No value changed" : fields.map(describe).join("; ") };
  });
  const columns: Column<VersionRow>[] = [
    {
      key: "version",
      header: "Version",
      value: (v) => v.version,
      align: "right",
      render: (v) => (v.version === inForce ? <span className="font-semibold">{v.version} (in force)</span> : v.version),
      primary: true,
    },
    { key: "createdAt", header: "Saved", value: (v) => v.createdAt, render: (v) => formatDateTime(v.createdAt) },
    { key: "note", header: "Note", value: (v) => v.note || null, wrap: true, render: (v) => v.note || <span className="text-muted">No note</span> },
    { key: "changes", header: "Changes from the version before", value: (v) => v.changes, wrap: true },
  ];
  return (
    <DataTable
      caption="Policy versions"
      columns={columns}
      rows={rows}
      rowKey={(v) => v.version}
      initialSort={{ key: "version", direction: "desc" }}
      exportFileName="policy-versions"
      filterable={rows.length > 8}
    />
  );
}
