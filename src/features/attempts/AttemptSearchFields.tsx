// The typed searches of the attempt list: a learner code (whole, or its start) and a class id. They are
// checked with the server's own schemas before they go into the URL, so a mistyped code is named here.
import { useState, type FormEvent } from "react";
import { learnerParamSchema, refParamSchema } from "../../../shared/filters";
import { Button } from "../../components/Button";
import { Input } from "../../components/Field";

export interface SearchValues {
  learner: string;
  learnerPrefix: boolean;
  classId: string;
}

function problem(schema: typeof learnerParamSchema, value: string): string | undefined {
  if (!value.trim()) return undefined;
  const result = schema.safeParse(value);
  return result.success ? undefined : result.error.issues[0]?.message;
}

export function AttemptSearchFields({ values, onSearch }: { values: SearchValues; onSearch: (values: SearchValues) => void }) {
  const [draft, setDraft] = useState(values);
  const [errors, setErrors] = useState<{ learner?: string; classId?: string }>({});
  // follow the URL when it changes from outside (back button, a link, "Clear"), in the same render
  const { learner, learnerPrefix, classId } = values;
  const [followed, setFollowed] = useState(values);
  if (followed.learner !== learner || followed.learnerPrefix !== learnerPrefix || followed.classId !== classId) {
    setFollowed(values);
    setDraft({ learner, learnerPrefix, classId });
  }

  function submit(event: FormEvent) {
    event.preventDefault();
    const found = { learner: problem(learnerParamSchema, draft.learner), classId: problem(refParamSchema, draft.classId) };
    setErrors(found);
    if (found.learner || found.classId) return;
    onSearch({ learner: draft.learner.trim(), learnerPrefix: draft.learnerPrefix, classId: draft.classId.trim() });
  }

  const anySet = learner !== "" || classId !== "";
  return (
    <form role="search" aria-label="Search attempts by learner or class" onSubmit={submit} className="flex w-full flex-wrap items-start gap-3">
      <div className="flex min-w-[min(100%,14rem)] flex-col gap-1">
        <Input
          label="Learner code"
          optional
          value={draft.learner}
          error={errors.learner}
          autoComplete="off"
          spellCheck={false}
          onChange={(event) => setDraft({ ...draft, learner: event.target.value })}
        />
        <label className="inline-flex min-h-8 items-center gap-2 text-small">
          <input
            type="checkbox"
            className="size-4"
            checked={draft.learnerPrefix}
            onChange={(event) => setDraft({ ...draft, learnerPrefix: event.target.checked })}
          />
          Codes that start with this
        </label>
      </div>
      <div className="flex min-w-[min(100%,12rem)] flex-col gap-1 self-start">
        <Input
          label="Class"
          optional
          value={draft.classId}
          error={errors.classId}
          autoComplete="off"
          spellCheck={false}
          onChange={(event) => setDraft({ ...draft, classId: event.target.value })}
        />
      </div>
      {/* the label's height, so the buttons line up with the boxes */}
      <div className="flex gap-2 sm:pt-7">
        <Button type="submit" variant="secondary">
          Search
        </Button>
        {anySet && (
          <Button variant="quiet" onClick={() => onSearch({ learner: "", learnerPrefix: false, classId: "" })}>
            Clear search
          </Button>
        )}
      </div>
    </form>
  );
}
