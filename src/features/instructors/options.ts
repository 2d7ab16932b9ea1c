import type { SelectOption } from "../../components/Field";
import type { InstructorRow } from "../../../shared/schemas/sites";

/** Instructors as select options, "NTH-04 · Robin Example (NTH)"; inactive ones only if already chosen. */
export function instructorOptions(instructors: readonly InstructorRow[], keepId?: number | null): SelectOption[] {
  return instructors
    .filter((instructor) => instructor.active || instructor.id === keepId)
    .sort((a, b) => a.code.localeCompare(b.code, undefined, { numeric: true }))
    .map((instructor) => ({
      value: String(instructor.id),
      label: `${instructor.code} · ${instructor.name}${instructor.siteCode ? ` (${instructor.siteCode})` : ""}${instructor.active ? "" : " — deactivated"}`,
    }));
}
