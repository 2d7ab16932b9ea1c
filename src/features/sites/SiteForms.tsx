// Add a site; rename one. Validated with the shared site schemas.
import { newSiteSchema, updateSiteSchema, type SiteRow } from "../../../shared/schemas/sites";
import { Button } from "../../components/Button";
import { Input } from "../../components/Field";
import { Notice } from "../../components/Notice";
import { useZodForm } from "../../lib/useZodForm";
import { useCreateSite, useUpdateSite } from "./mutations";

export function AddSiteForm({ onDone, onCancel }: { onDone: (site: SiteRow) => void; onCancel: () => void }) {
  const create = useCreateSite();
  const form = useZodForm(newSiteSchema, { code: "", name: "" });
  const submit = form.handleSubmit((site) =>
    create.mutate(site, { onSuccess: ({ site: created }) => onDone(created), onError: form.showServerError }),
  );
  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      {form.formError && <Notice tone="error">{form.formError}</Notice>}
      <Input
        label="Site code"
        name="code"
        autoComplete="off"
        spellCheck={false}
        hint="The code used in import files, e.g. NORTH-1. Letters, digits, '.', '_' or '-'; it cannot be changed later."
        value={form.values.code}
        onChange={(event) => form.setValue("code", event.target.value)}
        error={form.errors.code}
      />
      <Input
        label="Site name"
        name="name"
        autoComplete="off"
        value={form.values.name}
        onChange={(event) => form.setValue("name", event.target.value)}
        error={form.errors.name}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={create.isPending}>
          Add site
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

const renameSchema = updateSiteSchema.required({ name: true }).pick({ name: true });

export function RenameSiteForm({ site, onDone, onCancel }: { site: SiteRow; onDone: (site: SiteRow) => void; onCancel: () => void }) {
  const update = useUpdateSite();
  const form = useZodForm(renameSchema, { name: site.name });
  const submit = form.handleSubmit((changes) =>
    update.mutate({ id: site.id, changes }, { onSuccess: ({ site: saved }) => onDone(saved), onError: form.showServerError }),
  );
  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      <p className="text-small text-muted">
        Code <span className="font-medium text-ink">{site.code}</span> stays the same, so imports keep matching this site.
      </p>
      {form.formError && <Notice tone="error">{form.formError}</Notice>}
      <Input
        label="New name"
        name="name"
        autoComplete="off"
        value={form.values.name}
        onChange={(event) => form.setValue("name", event.target.value)}
        error={form.errors.name}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={update.isPending}>
          Rename
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
