// Improvement actions: what the network is doing to move a figure, where and since when. Quality leads and
// coordinators record them; instructors see the ones that concern them.
import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import { Link, useNavigate } from "react-router";
import type { ActionListRow } from "../../../shared/schemas/actions";
import { actionStatusNames, actionVerdictName, actionWords, aimFigureName } from "../../../shared/vocabulary";
import { Button } from "../../components/Button";
import { DataTable, type Column } from "../../components/DataTable";
import { Dialog } from "../../components/Dialog";
import { PageHeader } from "../../components/PageHeader";
import { SafetyNote } from "../../components/SafetyNote";
import { ErrorState, LoadingState } from "../../components/States";
import { ActionForm } from "./ActionForm";
import { actionQueries } from "./queries";
import { scopeLabel } from "../../../shared/actionScope";
import { formatPercent } from "../insight/format";
import { formatDay } from "../../lib/formatting";

const columns: Column<ActionListRow>[] = [
  {
    key: "title",
    header: actionWords.action,
    value: (a) => a.title,
    render: (a) => (
      <Link to={`/actions/${a.id}`} className="font-semibold text-dusk-700 underline underline-offset-2">
        {a.title}
      </Link>
    ),
    primary: true,
    wrap: true,
  },
  { key: "aim", header: actionWords.aim, value: (a) => aimFigureName(a.aim), wrap: true },
  { key: "target", header: actionWords.target, value: (a) => a.target, render: (a) => formatPercent(a.target / 100), align: "right" },
  { key: "scope", header: actionWords.scope, value: (a) => scopeLabel(a) },
  { key: "startDate", header: actionWords.startDate, value: (a) => a.startDate, render: (a) => formatDay(a.startDate) },
  { key: "owner", header: actionWords.owner, value: (a) => a.owner },
  { key: "status", header: actionWords.status, value: (a) => actionStatusNames[a.status] },
  { key: "verdict", header: actionWords.verdict, value: (a) => actionVerdictName(a.verdict) },
];

export default function ActionsPage() {
  const list = useQuery(actionQueries.list());
  const [adding, setAdding] = useState(false);
  const navigate = useNavigate();
  return (
    <div>
      <PageHeader
        title="Improvement actions"
        description="What the network is changing to move one figure, where and from when, with a before/after look at that figure."
        actions={list.data?.mayManage ? <Button onClick={() => setAdding(true)}>Record action</Button> : undefined}
      />
      {list.isPending ? (
        <LoadingState label="Loading improvement actions…" />
      ) : list.isError ? (
        <ErrorState error={list.error} title="The improvement actions could not be loaded" onRetry={() => list.refetch()} />
      ) : (
        <DataTable
          caption="Improvement actions"
          captionHidden
          columns={columns}
          rows={list.data.actions}
          rowKey={(a) => a.id}
          initialSort={{ key: "startDate", direction: "desc" }}
          exportFileName="quarterbeat-improvement-actions"
          emptyMessage={list.data.mayManage ? "No actions yet. Record the first one with “Record action”." : "No improvement action concerns you yet."}
        />
      )}
      <SafetyNote compact className="mt-4" />
      <Dialog open={adding} title="Record an improvement action" onClose={() => setAdding(false)}>
        <ActionForm onCancel={() => setAdding(false)} onDone={(action) => navigate(`/actions/${action.id}`)} />
      </Dialog>
    </div>
  );
}
