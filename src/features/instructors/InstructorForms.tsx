// Add an instructor; move one to another site. Validated with the shared instructor schemas.
import { useQuery } from "@tanstack/react-query";
import { useWatch } from "react-hook-form";
import { z } from "zod";
import { newInstructorSchema, type InstructorRow, type SiteRow } from "../../../shared/schemas/sites";
import type { SelectOption } from "../../components/Field";
import { FormField } from "../../components/FormField";
import { FormActions, FormShell } from "../../components/FormShell";
import { showServerError, useSchemaForm } from "../../lib/useSchemaForm";
import { siteQueries } from "../sites/queries";
import { useCreateInstructor, useUpdateInstructor } from "./mutations";

function siteOptions(sites: readonly SiteRow[], keepId: number | null): SelectOption[] {
  return sites
    .filter((site) => site.active || site.id === keepId)
    .sort((a, b) => a.code.localeCompare(b.code, undefined, { numeric: true }))
    .map((site) => ({ value: String(site.id), label: `${site.code} · ${site.name}${site.active ? "" : " — deactivated"}` }));
}

function SiteField({ label }: { label: string }) {
  const sites = useQuery(siteQueries.list());
  const siteId = useWatch<{ siteId: number | null }, "siteId">({ name: "siteId" });
  return (
    <FormField
      label={label}
      name="siteId"
      numeric
      hint={sites.isError ? "The site list could not be loaded." : "Where the instructor usually teaches."}
      placeholder={sites.isPending ? "Loading sites…" : "No site"}
      options={siteOptions(sites.data ?? [], siteId)}
    />
  );
}

export function AddInstructorForm({ onDone, onCancel }: { onDone: (instructor: InstructorRow) => void; onCancel: () => void }) {
  const create = useCreateInstructor();
  const form = useSchemaForm(newInstructorSchema, { code: "", name: "", siteId: null as number | null });
  return (
    <FormShell
      form={form}
      onValid={(instructor) =>
        create.mutate(instructor, { onSuccess: ({ instructor: created }) => onDone(created), onError: (error) => showServerError(form, error) })
      }
    >
      <FormField
        label="Instructor code"
        name="code"
        autoComplete="off"
        spellCheck={false}
        hint="The code used in class logs and manikin files, e.g. NORTH-07."
      />
      <FormField label="Name" name="name" autoComplete="off" />
      <SiteField label="Site" />
      <FormActions submitLabel="Add instructor" busy={create.isPending} onCancel={onCancel} />
    </FormShell>
  );
}

const moveSchema = z.object({ siteId: newInstructorSchema.shape.siteId });

export function ChangeSiteForm({
  instructor,
  onDone,
  onCancel,
}: {
  instructor: InstructorRow;
  onDone: (instructor: InstructorRow) => void;
  onCancel: () => void;
}) {
  const update = useUpdateInstructor();
  const form = useSchemaForm(moveSchema, { siteId: instructor.siteId });
  return (
    <FormShell
      form={form}
      onValid={(changes) =>
        update.mutate({ id: instructor.id, changes }, { onSuccess: ({ instructor: saved }) => onDone(saved), onError: (error) => showServerError(form, error) })
      }
      lead={
        <p>
          Move <strong>{instructor.name}</strong> ({instructor.code}).
        </p>
      }
    >
      <SiteField label="New site" />
      <FormActions submitLabel="Change site" busy={update.isPending} onCancel={onCancel} />
    </FormShell>
  );
}
