// The coordinator's text on what the network is doing about the most common errors, for one period. It
// shows on this page at once and goes into every report version created afterwards.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useId, useState, type FormEvent } from "react";
import { quarterNotesSchema } from "../../../shared/schemas/report";
import { Button } from "../../components/Button";
import { controlClass } from "../../components/Field";
import { Notice } from "../../components/Notice";
import { errorMessage } from "../../components/States";
import { periodLabel } from "../../../shared/period";
import { reportQueries, saveNotes } from "./queries";

const MAX = 4000;

export function NotesEditor({ period }: { period: string }) {
  const queryClient = useQueryClient();
  const notes = useQuery(reportQueries.notes(period));
  const [text, setText] = useState("");
  const [message, setMessage] = useState<{ tone: "success" | "error"; text: string } | null>(null);
  const id = useId();

  // The saved text replaces the draft whenever it changes (loaded, saved, or changed by someone else).
  const [shownSaved, setShownSaved] = useState<string | undefined>(undefined);
  if (notes.data !== undefined && notes.data !== shownSaved) {
    setShownSaved(notes.data);
    setText(notes.data);
  }

  const save = useMutation({
    mutationFn: (actions: string) => saveNotes(period, actions),
    onSuccess: (answer) => {
      queryClient.setQueryData(reportQueries.notes(period).queryKey, answer.actions);
      void queryClient.invalidateQueries({ queryKey: reportQueries.preview(period).queryKey });
    },
  });

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const parsed = quarterNotesSchema.safeParse({ actions: text });
    if (!parsed.success) {
      setMessage({ tone: "error", text: parsed.error.issues[0]?.message ?? "Check the text." });
      return;
    }
    save.mutate(parsed.data.actions, {
      onSuccess: () => setMessage({ tone: "success", text: "Saved. Versions created from now on include this text." }),
      onError: (error) => setMessage({ tone: "error", text: `Not saved: ${errorMessage(error)}` }),
    });
  }

  if (notes.isPending) return <p className="text-muted">Loading the text…</p>;
  if (notes.isError) return <Notice tone="error">The text could not be loaded: {errorMessage(notes.error)}</Notice>;

  const changed = text !== notes.data;
  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-2">
      <label htmlFor={id} className="text-small font-semibold">
        Your text for {periodLabel(period)}
      </label>
      <p id={`${id}-hint`} className="text-caption text-muted">
        Funders read this under the most common errors, on this page and in the PDF. Say what the network is doing about them: refresher sessions, feedback
        practice, equipment.
      </p>
      <textarea
        id={id}
        value={text}
        onChange={(event) => setText(event.target.value)}
        rows={5}
        maxLength={MAX}
        aria-describedby={`${id}-hint ${id}-count`}
        className={`${controlClass(false)} py-2`}
      />
      <p id={`${id}-count`} className="text-caption text-muted tabular-nums">
        {text.length} of {MAX} characters
      </p>
      <div className="flex flex-wrap items-center gap-2">
        <Button type="submit" variant="secondary" busy={save.isPending} disabled={!changed && !save.isPending}>
          Save text
        </Button>
        {changed && <span className="text-small text-muted">Unsaved changes</span>}
      </div>
      {message && <Notice tone={message.tone}>{message.text}</Notice>}
    </form>
  );
}
