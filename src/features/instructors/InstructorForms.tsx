// Add an instructor; move one to another site. Validated with the shared instructor schemas.
import { useQuery } from "@tanstack/react-query";
import { z } from "zod";
import { newInstructorSchema, type InstructorRow, type SiteRow } from "../../../shared/schemas/sites";
import { Button } from "../../components/Button";
import { Input, Select, type SelectOption } from "../../components/Field";
import { Notice } from "../../components/Notice";
import { useZodForm } from "../../lib/useZodForm";
import { siteQueries } from "../sites/queries";
import { useCreateInstructor, useUpdateInstructor } from "./mutations";

function siteOptions(sites: readonly SiteRow[], keepId: number | null): SelectOption[] {
  return sites
    .filter((site) => site.active || site.id === keepId)
    .sort((a, b) => a.code.localeCompare(b.code, undefined, { numeric: true }))
    .map((site) => ({ value: String(site.id), label: `${site.code} · ${site.name}${site.active ? "" : " — deactivated"}` }));
}

function SiteSelect({ label, value, error, onChange }: { label: string; value: number | null; error?: string; onChange: (id: number | null) => void }) {
  const sites = useQuery(siteQueries.list());
  return (
    <Select
      label={label}
      name="siteId"
      hint={sites.isError ? "The site list could not be loaded." : "Where the instructor usually teaches."}
      placeholder={sites.isPending ? "Loading sites…" : "No site"}
      options={siteOptions(sites.data ?? [], value)}
      value={value === null ? "" : String(value)}
      onChange={(event) => onChange(event.target.value ? Number(event.target.value) : null)}
      error={error}
    />
  );
}

export function AddInstructorForm({ onDone, onCancel }: { onDone: (instructor: InstructorRow) => void; onCancel: () => void }) {
  const create = useCreateInstructor();
  const form = useZodForm(newInstructorSchema, { code: "", name: "", siteId: null as number | null });
  const submit = form.handleSubmit((instructor) =>
    create.mutate(instructor, { onSuccess: ({ instructor: created }) => onDone(created), onError: form.showServerError }),
  );
  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      {form.formError && <Notice tone="error">{form.formError}</Notice>}
      <Input
        label="Instructor code"
        name="code"
        autoComplete="off"
        spellCheck={false}
        hint="The code used in class logs and manikin files, e.g. NORTH-07."
        value={form.values.code}
        onChange={(event) => form.setValue("code", event.target.value)}
        error={form.errors.code}
      />
      <Input
        label="Name"
        name="name"
        autoComplete="off"
        value={form.values.name}
        onChange={(event) => form.setValue("name", event.target.value)}
        error={form.errors.name}
      />
      <SiteSelect label="Site" value={form.values.siteId} error={form.errors.siteId} onChange={(id) => form.setValue("siteId", id)} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={create.isPending}>
          Add instructor
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

const moveSchema = z.object({ siteId: newInstructorSchema.shape.siteId });

export function ChangeSiteForm({ instructor, onDone, onCancel }: { instructor: InstructorRow; onDone: (instructor: InstructorRow) => void; onCancel: () => void }) {
  const update = useUpdateInstructor();
  const form = useZodForm(moveSchema, { siteId: instructor.siteId });
  const submit = form.handleSubmit((changes) =>
    update.mutate({ id: instructor.id, changes }, { onSuccess: ({ instructor: saved }) => onDone(saved), onError: form.showServerError }),
  );
  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      <p>
        Move <strong>{instructor.name}</strong> ({instructor.code}).
      </p>
      {form.formError && <Notice tone="error">{form.formError}</Notice>}
      <SiteSelect label="New site" value={form.values.siteId} error={form.errors.siteId} onChange={(id) => form.setValue("siteId", id)} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={update.isPending}>
          Change site
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
