// The network policy as a form: each field with its default and where that default comes from, checked by
// the same schema the server applies, with each message beside its field. Saving makes a new version.
import { useId, useMemo, useState, type FormEvent } from "react";
import type { PolicyFieldSource } from "../../../shared/schemas/policySettings";
import { networkPolicySchema, patientTypes, type NetworkPolicy } from "../../../shared/scoring/policy";
import type { LengthUnit } from "../../../shared/units";
import { Button } from "../../components/Button";
import { Field, controlClass } from "../../components/Field";
import { Notice } from "../../components/Notice";
import {
  allFields,
  displayValue,
  errorsByPath,
  fieldGroups,
  formValuesOf,
  policyFromValues,
  readPath,
  unitWord,
  type FormValues,
  type PolicyField,
} from "./policyFields";
import { patientTypeNames } from "../../../shared/vocabulary";

export interface PolicyFormProps {
  /** The version in force: the form starts from it. */
  current: { version: number; policy: NetworkPolicy };
  defaults: NetworkPolicy;
  fieldSources: readonly PolicyFieldSource[];
  unit: LengthUnit;
  canEdit: boolean;
  saving?: boolean;
  /** Field messages from a refused save, keyed by dotted path ("form" for the rest). */
  serverErrors?: Record<string, string>;
  onSave: (policy: NetworkPolicy, note: string) => void;
}

export const sourceKindLabels: Record<PolicyFieldSource["kind"], string> = {
  guideline: "guideline",
  guideline_with_project_tolerance: "guideline value, band is a project default",
  project_default: "project default",
};

/** "aha-2020-adult" → "AHA 2020 adult". */
export function shortSourceName(id: string): string {
  return id
    .split("-")
    .map((part) => (/^[a-z]{2,3}$/.test(part) && part !== "bls" ? part.toUpperCase() : part === "bls" ? "BLS" : part))
    .join(" ");
}

function sourceFor(path: string, sources: readonly PolicyFieldSource[]): PolicyFieldSource | undefined {
  const general = path.replace(/^bands\.[a-z]+\./, "bands.*.");
  return sources.find((s) => s.path === path) ?? sources.find((s) => s.path === general);
}

export function PolicyForm({ current, defaults, fieldSources, unit, canEdit, saving = false, serverErrors = {}, onSave }: PolicyFormProps) {
  const start = useMemo(() => formValuesOf(current.policy, unit), [current.policy, unit]);
  const [values, setValues] = useState<FormValues>(start);
  const [note, setNote] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [submitted, setSubmitted] = useState(false);
  const noteId = useId();
  const shown = { ...serverErrors, ...errors };

  function check(next: FormValues): { policy: NetworkPolicy; errors: Record<string, string> } {
    const policy = policyFromValues(next, current.policy, unit, [defaults]);
    const result = networkPolicySchema.safeParse(policy);
    return { policy, errors: result.success ? {} : errorsByPath(result.error.issues) };
  }

  function change(path: string, text: string) {
    const next = { ...values, [path]: text };
    setValues(next);
    if (submitted) setErrors(check(next).errors);
  }

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setSubmitted(true);
    const result = check(values);
    setErrors(result.errors);
    if (Object.keys(result.errors).length > 0) {
      const firstPath = allFields.find((field) => result.errors[field.path])?.path;
      const first = firstPath ? event.currentTarget.elements.namedItem(firstPath) : null;
      if (first instanceof HTMLElement) first.focus();
      return;
    }
    if (note.length > 500) return;
    onSave(result.policy, note.trim());
  }

  const dirty = Object.keys(start).some((key) => start[key] !== values[key]);
  const errorCount = Object.keys(shown).filter((k) => k !== "form").length;

  const input = (field: PolicyField) => {
    const source = sourceFor(field.path, fieldSources);
    const defaultText = displayValue(field, readPath(defaults, field.path), unit);
    const word = unitWord(field.kind, unit);
    const sourceWords = source
      ? `${sourceKindLabels[source.kind]}${source.sources.length ? `: ${source.sources.map(shortSourceName).join(", ")}` : ""}`
      : "project default";
    return (
      <Field
        key={field.path}
        label={word ? `${field.label} (${word})` : field.label}
        hint={
          <>
            Default {defaultText}
            {word ? ` ${word}` : ""} — {sourceWords}
            {source?.note ? `. ${source.note}` : ""}
            {readPath(current.policy, field.path) !== readPath(defaults, field.path) && (
              <strong className="font-semibold text-ink"> In force: changed from the default.</strong>
            )}
          </>
        }
        error={shown[field.path]}
      >
        {({ id, describedBy, invalid }) => (
          <input
            id={id}
            name={field.path}
            inputMode="decimal"
            autoComplete="off"
            aria-describedby={describedBy}
            aria-invalid={invalid || undefined}
            readOnly={!canEdit}
            value={values[field.path] ?? ""}
            onChange={(event) => change(field.path, event.target.value)}
            // mt-auto: fields side by side keep their boxes on one line whatever the length of their hints
            className={controlClass(invalid) + " mt-auto" + (canEdit ? "" : " bg-paper text-muted")}
          />
        )}
      </Field>
    );
  };

  const fieldset = (legend: string, fields: PolicyField[], intro?: React.ReactNode) => (
    <fieldset key={legend} className="flex min-w-0 flex-col gap-4 rounded-card border border-line bg-surface p-4 shadow-card">
      <legend className="px-1 text-lead font-semibold">{legend}</legend>
      {intro && <div className="-mt-2 text-small text-muted">{intro}</div>}
      <div className="grid grid-cols-[repeat(auto-fill,minmax(min(100%,15rem),1fr))] gap-4">{fields.map(input)}</div>
    </fieldset>
  );

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-5" aria-label="Scoring policy">
      {shown.form && <Notice tone="error">{shown.form}</Notice>}
      {submitted && errorCount > 0 && (
        <Notice tone="error">
          {errorCount === 1 ? "One value needs attention" : `${errorCount} values need attention`}; the message is beside each field.
        </Notice>
      )}
      <h3 className="text-title">Targets per patient type</h3>
      <p className="-mt-3 text-small text-muted">
        Depths in {unit === "mm" ? "millimetres" : unit === "cm" ? "centimetres" : "inches"} (your unit, set on your account page); they are stored in
        millimetres.
      </p>
      <div className="grid gap-4 xl:grid-cols-3">{patientTypes.map((type) => fieldset(patientTypeNames[type], fieldGroups.bands[type]))}</div>
      {fieldset("Pauses", fieldGroups.pauses)}
      {fieldset(
        "Pass rule",
        fieldGroups.passRule,
        <p>
          <strong className="text-ink">The pass rule is network policy, not a guideline.</strong> No resuscitation guideline publishes a pass mark in percent of
          compressions; the targets it counts against come from the guidelines.
        </p>,
      )}
      {fieldset(
        "Privacy",
        fieldGroups.privacy,
        "Groups with fewer attempts, or with the attempts of fewer other instructors, are hidden from funders and from instructors looking at others, to protect learners and colleagues.",
      )}
      {fieldset(
        "Equipment",
        fieldGroups.equipment,
        "When a manikin is due for service and how many mouthpiece cleans a class should log. Network policy, not a manufacturer’s figure.",
      )}
      {canEdit && (
        <div className="flex flex-col gap-3 rounded-card border border-line bg-surface p-4 shadow-card">
          <Field
            label="Note for this version"
            optional
            hint="Why the policy changes, for the version list (at most 500 characters)."
            error={note.length > 500 ? `Use at most 500 characters (now ${note.length})` : undefined}
          >
            {({ id, describedBy, invalid }) => (
              <textarea
                id={id}
                aria-describedby={[describedBy, noteId].filter(Boolean).join(" ")}
                aria-invalid={invalid || undefined}
                value={note}
                onChange={(event) => setNote(event.target.value)}
                rows={2}
                className={controlClass(invalid) + " py-2"}
              />
            )}
          </Field>
          <p id={noteId} className="text-caption text-muted">
            Saving makes version {current.version + 1}. Stored scores keep the version that made them until you rescore.
          </p>
          <div className="flex flex-wrap gap-2">
            <Button type="submit" busy={saving} disabled={!dirty}>
              Save as version {current.version + 1}
            </Button>
            <Button
              variant="secondary"
              disabled={!dirty || saving}
              onClick={() => {
                setValues(start);
                setErrors({});
                setSubmitted(false);
              }}
            >
              Undo changes
            </Button>
            <Button
              variant="quiet"
              disabled={saving}
              onClick={() => {
                const next = formValuesOf(defaults, unit);
                setValues(next);
                if (submitted) setErrors(check(next).errors);
              }}
            >
              Fill in the project defaults
            </Button>
          </div>
          {!dirty && <p className="text-caption text-muted">Change a value to save a new version.</p>}
        </div>
      )}
    </form>
  );
}
