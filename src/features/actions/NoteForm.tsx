// A dated note on an improvement action's progress.
import { useId } from "react";
import { newActionNoteSchema } from "../../../shared/schemas/actions";
import { Button } from "../../components/Button";
import { controlClass, Input } from "../../components/Field";
import { Notice } from "../../components/Notice";
import { showServerError, useSchemaForm } from "../../lib/useSchemaForm";
import { useAddNote } from "./mutations";

export function NoteForm({ actionId, today = new Date().toISOString().slice(0, 10) }: { actionId: number; today?: string }) {
  const add = useAddNote();
  const id = useId();
  const form = useSchemaForm(newActionNoteSchema, { date: today, text: "" });
  const values = form.watch();
  const errors = { date: form.formState.errors.date?.message, text: form.formState.errors.text?.message };
  const formError = form.formState.errors.root?.server?.message ?? null;
  const setValue = (name: "date" | "text", value: string): void =>
    form.setValue(name, value, { shouldValidate: form.formState.isSubmitted, shouldDirty: true });
  const submit = form.handleSubmit((note) =>
    add.mutate({ actionId, note }, { onSuccess: () => form.reset({ date: note.date, text: "" }), onError: (error) => showServerError(form, error) }),
  );
  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-3">
      {formError && <Notice tone="error">{formError}</Notice>}
      <Input
        label="Date"
        name="date"
        type="date"
        value={values.date}
        onChange={(event) => setValue("date", event.target.value)}
        error={errors.date}
        className="max-w-xs"
      />
      <div className="flex flex-col gap-1">
        <label htmlFor={id} className="text-small font-semibold text-ink">
          Note
        </label>
        <textarea
          id={id}
          name="text"
          rows={3}
          maxLength={2000}
          value={values.text}
          onChange={(event) => setValue("text", event.target.value)}
          aria-invalid={errors.text ? true : undefined}
          aria-describedby={errors.text ? `${id}-error` : undefined}
          className={`${controlClass(Boolean(errors.text))} py-2`}
        />
        {errors.text && (
          <p id={`${id}-error`} className="text-small font-medium text-danger-text">
            {errors.text}
          </p>
        )}
      </div>
      <div>
        <Button type="submit" variant="secondary" busy={add.isPending}>
          Add note
        </Button>
      </div>
    </form>
  );
}
