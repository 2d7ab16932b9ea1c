// Add a site; rename one. Validated with the shared site schemas.
import { newSiteSchema, updateSiteSchema, type SiteRow } from "../../../shared/schemas/sites";
import { FormField } from "../../components/FormField";
import { FormActions, FormShell } from "../../components/FormShell";
import { showServerError, useSchemaForm } from "../../lib/useSchemaForm";
import { useCreateSite, useUpdateSite } from "./mutations";

export function AddSiteForm({ onDone, onCancel }: { onDone: (site: SiteRow) => void; onCancel: () => void }) {
  const create = useCreateSite();
  const form = useSchemaForm(newSiteSchema, { code: "", name: "" });
  return (
    <FormShell
      form={form}
      onValid={(site) => create.mutate(site, { onSuccess: ({ site: created }) => onDone(created), onError: (error) => showServerError(form, error) })}
    >
      <FormField
        label="Site code"
        name="code"
        autoComplete="off"
        spellCheck={false}
        hint="The code used in import files, e.g. NORTH-1. Letters, digits, '.', '_' or '-'; it cannot be changed later."
      />
      <FormField label="Site name" name="name" autoComplete="off" />
      <FormActions submitLabel="Add site" busy={create.isPending} onCancel={onCancel} />
    </FormShell>
  );
}

const renameSchema = updateSiteSchema.required({ name: true }).pick({ name: true });

export function RenameSiteForm({ site, onDone, onCancel }: { site: SiteRow; onDone: (site: SiteRow) => void; onCancel: () => void }) {
  const update = useUpdateSite();
  const form = useSchemaForm(renameSchema, { name: site.name });
  return (
    <FormShell
      form={form}
      onValid={(changes) =>
        update.mutate({ id: site.id, changes }, { onSuccess: ({ site: saved }) => onDone(saved), onError: (error) => showServerError(form, error) })
      }
      lead={
        <p className="text-small text-muted">
          Code <span className="font-medium text-ink">{site.code}</span> stays the same, so imports keep matching this site.
        </p>
      }
    >
      <FormField label="New name" name="name" autoComplete="off" />
      <FormActions submitLabel="Rename" busy={update.isPending} onCancel={onCancel} />
    </FormShell>
  );
}
