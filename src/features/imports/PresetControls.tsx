// Saved mappings ("presets"): the same JSON the command line reads with --map, kept under a name so the
// next export from the same tool needs no matching by hand.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState, type FormEvent } from "react";
import type { ImportKind } from "../../../shared/domain";
import { newPresetSchema } from "../../../shared/import/api";
import type { ImportMapping } from "../../../shared/import/mapping";
import { ApiError } from "../../api/http";
import { Button } from "../../components/Button";
import { Input, Select } from "../../components/Field";
import { Notice } from "../../components/Notice";
import { errorMessage } from "../../components/States";
import { fieldProblems } from "../../api/fieldProblems";
import { useCan } from "../auth/useCan";
import { useCurrentUser } from "../auth/useSession";
import { kindLabels } from "./labels";
import { draftFromMapping, type MappingDraft } from "./mappingDraft";
import { deletePreset, importQueries, savePreset } from "./queries";

export interface PresetControlsProps {
  kind: ImportKind;
  header: readonly string[];
  mapping: ImportMapping;
  onApply: (draft: MappingDraft) => void;
}

type Message = { tone: "success" | "error"; text: string } | null;

export function PresetControls({ kind, header, mapping, onApply }: PresetControlsProps) {
  const user = useCurrentUser();
  const queryClient = useQueryClient();
  const presets = useQuery(importQueries.presets(kind));
  const [chosen, setChosen] = useState("");
  const [name, setName] = useState("");
  const [nameError, setNameError] = useState<string | undefined>();
  const [message, setMessage] = useState<Message>(null);
  const refresh = () => queryClient.invalidateQueries({ queryKey: importQueries.presets(kind).queryKey });

  const save = useMutation({ mutationFn: (presetName: string) => savePreset(presetName, kind, mapping), onSuccess: refresh });
  const remove = useMutation({ mutationFn: deletePreset, onSuccess: refresh });

  const selected = presets.data?.find((p) => String(p.id) === chosen) ?? null;
  const deletesAnyPreset = useCan("importData", "any");
  const mayDelete = selected !== null && (deletesAnyPreset || selected.createdBy === user.id);

  function apply() {
    if (!selected) {
      setMessage({ tone: "error", text: "Choose a saved mapping first." });
      return;
    }
    onApply(draftFromMapping(kind, header, selected.mapping));
    setMessage({ tone: "success", text: `Using the mapping “${selected.name}”. Check the matches below.` });
  }

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setMessage(null);
    const parsed = newPresetSchema.shape.name.safeParse(name);
    if (!parsed.success) {
      setNameError(parsed.error.issues[0]?.message);
      return;
    }
    setNameError(undefined);
    save.mutate(parsed.data, {
      onSuccess: (preset) => {
        setName("");
        setChosen(String(preset.id));
        setMessage({ tone: "success", text: `Saved as “${preset.name}”. It is offered for every ${kindLabels[kind].toLowerCase()} file from now on.` });
      },
      onError: (error) => {
        const fields = error instanceof ApiError ? fieldProblems(error.details) : {};
        if (fields.name) setNameError(error instanceof ApiError && error.status === 409 ? `${error.message} Choose another name.` : fields.name);
        else setMessage({ tone: "error", text: `The mapping was not saved: ${errorMessage(error)}` });
      },
    });
  }

  function removeSelected() {
    if (!selected) return;
    setMessage(null);
    remove.mutate(selected.id, {
      onSuccess: () => {
        setChosen("");
        setMessage({ tone: "success", text: `Deleted the saved mapping “${selected.name}”.` });
      },
      onError: (error) => setMessage({ tone: "error", text: `“${selected.name}” was not deleted: ${errorMessage(error)}` }),
    });
  }

  const options = (presets.data ?? []).map((p) => ({ value: String(p.id), label: p.name }));

  return (
    <section aria-labelledby="presets-heading" className="flex flex-col gap-3 rounded-card border border-line bg-surface p-4 shadow-card">
      <div>
        <h3 id="presets-heading" className="text-lead font-semibold">
          Saved mappings
        </h3>
        <p className="text-small text-muted">Load a mapping saved for files from the same tool, or save this one for next time.</p>
      </div>
      <div className="grid gap-4 lg:grid-cols-2">
        <div className="flex flex-wrap items-end gap-2">
          <Select
            label={`Saved mappings for ${kindLabels[kind].toLowerCase()}`}
            className="min-w-[min(100%,14rem)] flex-1"
            options={options}
            placeholder={presets.isPending ? "Loading…" : options.length === 0 ? "None saved yet" : "Choose a saved mapping…"}
            value={chosen}
            onChange={(event) => setChosen(event.target.value)}
            hint={presets.isError ? `The list could not be loaded: ${errorMessage(presets.error)}` : undefined}
          />
          <Button variant="secondary" onClick={apply} disabled={options.length === 0}>
            Use this mapping
          </Button>
          {mayDelete && (
            <Button variant="dangerQuiet" onClick={removeSelected} busy={remove.isPending}>
              Delete<span className="sr-only"> the saved mapping {selected?.name}</span>
            </Button>
          )}
        </div>
        <form onSubmit={submit} noValidate className="flex flex-wrap items-end gap-2">
          <Input
            label="Save this mapping as"
            className="min-w-[min(100%,14rem)] flex-1"
            value={name}
            maxLength={80}
            onChange={(event) => setName(event.target.value)}
            error={nameError}
            placeholder="e.g. North site export, depths in inches"
            autoComplete="off"
          />
          <Button type="submit" variant="secondary" busy={save.isPending}>
            Save mapping
          </Button>
        </form>
      </div>
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
    </section>
  );
}
