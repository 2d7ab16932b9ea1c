// Methods (every signed-in role): how each figure is worked out, in plain words with its source, from the one
// list in shared/methods.ts that docs/methods.md also gives.
import { methodNotes } from "../../../shared/methods";
import { PageHeader } from "../../components/PageHeader";
import { SafetyNote } from "../../components/SafetyNote";

export default function MethodsPage() {
  return (
    <div className="flex max-w-3xl flex-col gap-6">
      <PageHeader title="Methods" description="How Quarterbeat works out its figures and comparisons, in plain words, with the source of each method." />
      <SafetyNote />
      <nav aria-label="Methods on this page">
        <ul className="flex flex-wrap gap-x-4 gap-y-1 text-small">
          {methodNotes.map((note) => (
            <li key={note.id}>
              <a href={`#${note.id}`} className="text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
                {note.title}
              </a>
            </li>
          ))}
        </ul>
      </nav>
      {methodNotes.map((note) => (
        <section key={note.id} id={note.id} aria-labelledby={`${note.id}-heading`} className="flex flex-col gap-2">
          <h2 id={`${note.id}-heading`} className="text-title">
            {note.title}
          </h2>
          <p>{note.text}</p>
          <h3 className="text-small font-semibold text-muted">{note.sources.length === 1 ? "Source" : "Sources"}</h3>
          <ul className="list-disc pl-5 text-small text-muted">
            {note.sources.map((source) => (
              <li key={source}>{source}</li>
            ))}
          </ul>
        </section>
      ))}
    </div>
  );
}
