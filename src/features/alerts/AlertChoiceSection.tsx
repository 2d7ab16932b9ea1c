// "Alerts after each import" on the account page: one box per kind of signal with what it means, saved with
// the button. What an instructor may be told is narrowed by the server, whatever is ticked here.
import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { alertKindExplanations, alertKindLabels, alertKinds } from "../../../shared/alertKinds";
import { alertChoiceSchema, type AlertChoice } from "../../../shared/schemas/alerts";
import { Button } from "../../components/Button";
import { FormShell } from "../../components/FormShell";
import { Notice } from "../../components/Notice";
import { ErrorState, LoadingState } from "../../components/States";
import { showServerError, useSchemaForm } from "../../lib/useSchemaForm";
import { useCan } from "../auth/useCan";
import { alertQueries, useSaveAlertChoice } from "./queries";

export function AlertChoiceSection() {
  const choice = useQuery(alertQueries.choice());
  return (
    <section aria-labelledby="account-alerts" className="rounded-card border border-line bg-surface p-5 shadow-card">
      <h2 id="account-alerts" className="mb-1 text-title">
        Alerts after each import
      </h2>
      <p className="mb-3 text-small text-muted">
        After each import Quarterbeat e-mails you the new signals of the kinds you tick. A signal is a reason to look, not a verdict.
      </p>
      {choice.isPending ? (
        <LoadingState label="Loading your alert choice…" />
      ) : choice.isError ? (
        <ErrorState error={choice.error} onRetry={() => void choice.refetch()} />
      ) : (
        <AlertChoiceForm initial={choice.data.kinds} isDefault={choice.data.isDefault} />
      )}
    </section>
  );
}

function AlertChoiceForm({ initial, isDefault }: { initial: AlertChoice["kinds"]; isDefault: boolean }) {
  const save = useSaveAlertChoice();
  const form = useSchemaForm(alertChoiceSchema, { kinds: initial });
  const [saved, setSaved] = useState(false);
  // an instructor is told only about their own site and themselves: say so beside the boxes
  const seesEveryone = useCan("receiveImportAlerts", "any");

  function submit(values: AlertChoice) {
    setSaved(false);
    save.mutate(values, {
      onSuccess: (answer) => {
        form.reset({ kinds: answer.kinds });
        setSaved(true);
      },
      onError: (error) => showServerError(form, error),
    });
  }

  return (
    <FormShell form={form} onValid={submit}>
      {saved && <Notice tone="success">Saved. The next digest follows this choice.</Notice>}
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-2 text-small font-semibold text-ink">E-mail me about</legend>
        {!seesEveryone && <p className="mb-1 text-small text-muted">Only signals about you and your own site reach you.</p>}
        {isDefault && <p className="mb-1 text-small text-muted">These are your role's usual alerts until you save a choice.</p>}
        {alertKinds.map((kind) => (
          <label
            key={kind}
            className="flex min-h-11 cursor-pointer items-start gap-3 rounded-control border border-line px-3 py-2 has-checked:border-dusk-600 has-checked:bg-dusk-50"
          >
            <input
              type="checkbox"
              value={kind}
              {...form.register("kinds")}
              aria-labelledby={`alert-kind-${kind}-label`}
              aria-describedby={`alert-kind-${kind}`}
              className="mt-1 size-4 accent-dusk-700"
            />
            <span className="flex flex-col">
              <span id={`alert-kind-${kind}-label`} className="font-medium">
                {alertKindLabels[kind]}
              </span>
              <span id={`alert-kind-${kind}`} className="text-small text-muted">
                {alertKindExplanations[kind]}
              </span>
            </span>
          </label>
        ))}
      </fieldset>
      <Button type="submit" busy={save.isPending} className="self-start">
        Save alert choice
      </Button>
    </FormShell>
  );
}
