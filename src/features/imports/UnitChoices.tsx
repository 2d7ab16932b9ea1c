// The units the file uses. Quarterbeat stores millimetres, milliseconds and percentages; the mapping says
// how to convert. The first value of the file is shown converted, so a wrong choice is easy to spot.
import type { ImportKind } from "../../../shared/domain";
import { MM_PER_CM, MM_PER_INCH } from "../../../shared/units";
import { unitLabels } from "./labels";
import { unitGroupsOf, type MappingDraft } from "./mappingDraft";

export interface UnitChoicesProps {
  kind: ImportKind;
  units: MappingDraft["units"];
  onChange: (units: MappingDraft["units"]) => void;
  /** The first value of a Quarterbeat column in the file, or null. */
  sample: (column: string) => string | null;
}

const questions: Record<ImportKind, Partial<Record<"depth" | "time" | "share", string>>> = {
  classes: {},
  equipment: {},
  attempts: { depth: "Mean depth (depth_mm) in the file is in", share: "Shares (the _pct columns) in the file are" },
  compressions: { depth: "Depth and release (depth_mm, release_mm) in the file are in", time: "Compression times (t_ms) in the file are in" },
};

const oneDecimal = (value: number) => (Math.round(value * 10) / 10).toString();

function converted(group: "depth" | "time" | "share", units: MappingDraft["units"], raw: string | null): string | null {
  const value = raw === null ? NaN : Number(raw);
  if (!Number.isFinite(value)) return null;
  if (group === "depth") {
    const factor = units.depth === "in" ? MM_PER_INCH : units.depth === "cm" ? MM_PER_CM : 1;
    return `${raw} ${units.depth} → ${oneDecimal(value * factor)} mm`;
  }
  if (group === "time") return `${raw} ${units.time} → ${oneDecimal(units.time === "s" ? value * 1000 : value)} ms`;
  return `${raw} → ${oneDecimal(units.shares === "fraction" ? value * 100 : value)} %`;
}

export function UnitChoices({ kind, units, onChange, sample }: UnitChoicesProps) {
  const groups = unitGroupsOf(kind);
  const sampleColumn = { depth: "depth_mm", time: "t_ms", share: kind === "attempts" ? "depth_ok_pct" : "" } as const;
  return (
    <section aria-labelledby="units-heading" className="flex flex-col gap-3">
      <div>
        <h3 id="units-heading" className="text-lead font-semibold">
          Units in the file
        </h3>
        <p className="text-small text-muted">
          Quarterbeat keeps depths in millimetres, times in milliseconds and shares as percentages; it converts from the units you choose.
        </p>
      </div>
      <div className="grid gap-4 sm:grid-cols-2">
        {groups.map((group) => {
          const key = group === "share" ? "shares" : group;
          const choices = Object.entries(unitLabels[key]) as [string, string][];
          const example = converted(group, units, sample(sampleColumn[group]));
          return (
            <fieldset key={group} className="flex flex-col gap-1 rounded-card border border-line bg-surface p-4 shadow-card">
              <legend className="float-left mb-1 w-full text-small font-semibold">{questions[kind][group]}</legend>
              {choices.map(([value, label]) => (
                <label key={value} className="flex min-h-9 cursor-pointer items-center gap-2">
                  <input
                    type="radio"
                    name={`unit-${group}`}
                    value={value}
                    checked={units[key] === value}
                    onChange={() => onChange({ ...units, [key]: value })}
                    className="size-4 accent-dusk-700"
                  />
                  {label}
                </label>
              ))}
              {example && <p className="mt-1 text-caption text-muted">First row: {example}</p>}
            </fieldset>
          );
        })}
      </div>
    </section>
  );
}
