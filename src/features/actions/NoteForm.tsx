// A dated note on an improvement action's progress.
import { useId } from "react";
import { newActionNoteSchema } from "../../../shared/schemas/actions";
import { Button } from "../../components/Button";
import { controlClass, Input } from "../../components/Field";
import { Notice } from "../../components/Notice";
import { useZodForm } from "../../lib/useZodForm";
import { useAddNote } from "./mutations";

export function NoteForm({ actionId, today = new Date().toISOString().slice(0, 10) }: { actionId: number; today?: string }) {
  const add = useAddNote();
  const id = useId();
  const form = useZodForm(newActionNoteSchema, { date: today, text: "" });
  const submit = form.handleSubmit((note) => add.mutate({ actionId, note }, { onSuccess: () => form.reset({ date: note.date, text: "" }), onError: form.showServerError }));
  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-3">
      {form.formError && <Notice tone="error">{form.formError}</Notice>}
      <Input label="Date" name="date" type="date" value={form.values.date} onChange={(event) => form.setValue("date", event.target.value)} error={form.errors.date} className="max-w-xs" />
      <div className="flex flex-col gap-1">
        <label htmlFor={id} className="text-small font-semibold text-ink">
          Note
        </label>
        <textarea
          id={id}
          name="text"
          rows={3}
          maxLength={2000}
          value={form.values.text}
          onChange={(event) => form.setValue("text", event.target.value)}
          aria-invalid={form.errors.text ? true : undefined}
          aria-describedby={form.errors.text ? `${id}-error` : undefined}
          className={`${controlClass(Boolean(form.errors.text))} py-2`}
        />
        {form.errors.text && (
          <p id={`${id}-error`} className="text-small font-medium text-danger-text">
            {form.errors.text}
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
