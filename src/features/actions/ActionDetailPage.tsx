// One improvement action: what, aim and target, scope, start, owner and status, its dated notes, and the
// evaluation of its aim before and after the start.
import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import { Link, useParams } from "react-router";
import { actionStatusNames, actionWords, aimFigureName } from "../../../shared/vocabulary";
import { Button } from "../../components/Button";
import { Dialog } from "../../components/Dialog";
import { PageHeader } from "../../components/PageHeader";
import { ErrorState, LoadingState } from "../../components/States";
import { ActionEvaluation } from "./ActionEvaluation";
import { MonthlyRunChart } from "./MonthlyRunChart";
import { ActionForm } from "./ActionForm";
import { NoteForm } from "./NoteForm";
import { actionQueries } from "./queries";
import { scopeLabel } from "../../../shared/actionScope";
import { formatPercent } from "../insight/format";
import { formatDay } from "../../lib/formatting";

export default function ActionDetailPage() {
  const { id = "" } = useParams();
  const detail = useQuery(actionQueries.detail(Number(id)));
  const [editing, setEditing] = useState(false);
  return (
    <div>
      <Link to="/actions" className="mb-3 inline-flex min-h-9 items-center gap-1 font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
        <span aria-hidden="true">←</span> All improvement actions
      </Link>
      {detail.isPending ? (
        <LoadingState label="Loading the improvement action…" />
      ) : detail.isError ? (
        <ErrorState error={detail.error} title="The improvement action could not be loaded" onRetry={() => detail.refetch()} />
      ) : (
        <>
          <PageHeader
            title={detail.data.action.title}
            description={`${aimFigureName(detail.data.action.aim)} · ${scopeLabel(detail.data.action)}`}
            actions={
              detail.data.mayManage ? (
                <Button variant="secondary" onClick={() => setEditing(true)}>
                  Change
                </Button>
              ) : undefined
            }
          />
          <dl className="mb-8 grid gap-3 sm:grid-cols-3">
            {[
              [actionWords.target, formatPercent(detail.data.action.target / 100)],
              [actionWords.startDate, formatDay(detail.data.action.startDate)],
              [actionWords.owner, detail.data.action.owner],
              [actionWords.status, actionStatusNames[detail.data.action.status]],
              [actionWords.scope, scopeLabel(detail.data.action)],
            ].map(([label, value]) => (
              <div key={label}>
                <dt className="text-small font-semibold">{label}</dt>
                <dd>{value}</dd>
              </div>
            ))}
          </dl>
          <section aria-labelledby="evaluation-heading" className="mb-10">
            <h2 id="evaluation-heading" className="mb-3 text-title">
              Before and after
            </h2>
            <ActionEvaluation action={detail.data.action} evaluation={detail.data.evaluation} />
          </section>
          <section aria-labelledby="monthly-heading" className="mb-10">
            <h2 id="monthly-heading" className="mb-3 text-title">
              Month by month
            </h2>
            <MonthlyRunChart action={detail.data.action} />
          </section>
          <section aria-labelledby="notes-heading" className="mb-10">
            <h2 id="notes-heading" className="mb-3 text-title">
              {actionWords.notes}
            </h2>
            {detail.data.notes.length === 0 ? (
              <p className="mb-4 text-small text-muted">No notes yet.</p>
            ) : (
              <ol className="mb-4 flex flex-col gap-2">
                {detail.data.notes.map((note) => (
                  <li key={note.id} className="rounded-control border border-line bg-surface px-3 py-2">
                    <p className="text-small font-semibold">{formatDay(note.date)}</p>
                    <p className="whitespace-pre-wrap">{note.text}</p>
                  </li>
                ))}
              </ol>
            )}
            {detail.data.mayManage && <NoteForm actionId={detail.data.action.id} />}
          </section>
          <Dialog open={editing} title="Change the improvement action" onClose={() => setEditing(false)}>
            <ActionForm action={detail.data.action} onCancel={() => setEditing(false)} onDone={() => setEditing(false)} />
          </Dialog>
        </>
      )}
    </div>
  );
}
