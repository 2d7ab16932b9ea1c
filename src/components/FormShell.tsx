// The frame of every schema form: the form element wired to react-hook-form, the message for the whole
// form at its top, and the usual submit and cancel buttons.
import clsx from "clsx";
import type { ReactNode } from "react";
import { FormProvider, type FieldValues } from "react-hook-form";
import type { SchemaForm } from "../lib/useSchemaForm";
import { Button } from "./Button";
import { Notice } from "./Notice";

export interface FormShellProps<Values extends FieldValues, Output> {
  form: SchemaForm<Values, Output>;
  /** Runs with the schema's output once every field is valid. */
  onValid: (data: Output) => void;
  /** Shown above the form's message, e.g. what is being edited. */
  lead?: ReactNode;
  className?: string;
  children: ReactNode;
}

export function FormShell<Values extends FieldValues, Output>({ form, onValid, lead, className, children }: FormShellProps<Values, Output>) {
  const formError = form.formState.errors.root?.server?.message;
  return (
    <FormProvider {...form}>
      <form noValidate onSubmit={form.handleSubmit(onValid)} className={clsx("flex flex-col gap-4", className)}>
        {lead}
        {formError && <Notice tone="error">{formError}</Notice>}
        {children}
      </form>
    </FormProvider>
  );
}

export function FormActions({ submitLabel, busy, onCancel }: { submitLabel: string; busy: boolean; onCancel: () => void }) {
  return (
    <div className="flex flex-wrap gap-2">
      <Button type="submit" busy={busy}>
        {submitLabel}
      </Button>
      <Button variant="secondary" onClick={onCancel}>
        Cancel
      </Button>
    </div>
  );
}
