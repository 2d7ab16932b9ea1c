// Alerts: the signals Quarterbeat mailed after imports. Everyone who receives alerts sees their own; a
// coordinator can switch to every user's, each signal once with how many people it went to (?view=all).
import { useQuery } from "@tanstack/react-query";
import { Link, useSearchParams } from "react-router";
import { Button } from "../../components/Button";
import { PageHeader } from "../../components/PageHeader";
import { ErrorState, LoadingState } from "../../components/States";
import { AlertHistoryTable } from "./AlertHistoryTable";
import { alertQueries } from "./queries";
import { useCan } from "../auth/useCan";

export default function AlertsPage() {
  const seesAll = useCan("readAllAlerts");
  const [params, setParams] = useSearchParams();
  const everyone = seesAll && params.get("view") === "all";

  function choose(all: boolean) {
    setParams((previous) => {
      const next = new URLSearchParams(previous);
      if (all) next.set("view", "all");
      else next.delete("view");
      return next;
    });
  }

  return (
    <div>
      <PageHeader
        title="Alerts"
        description={
          <>
            The signals e-mailed after imports, newest first. Choose which kinds reach you on{" "}
            <Link to="/account" className="font-medium text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
              My account
            </Link>
            .
          </>
        }
        actions={
          seesAll ? (
            <div role="group" aria-label="Whose alerts" className="flex gap-2">
              <Button variant={everyone ? "secondary" : "primary"} aria-pressed={!everyone} onClick={() => choose(false)}>
                Mine
              </Button>
              <Button variant={everyone ? "primary" : "secondary"} aria-pressed={everyone} onClick={() => choose(true)}>
                All users' alerts
              </Button>
            </div>
          ) : undefined
        }
      />
      {everyone ? <EveryonesAlerts /> : <MyAlerts />}
    </div>
  );
}

function MyAlerts() {
  const mine = useQuery(alertQueries.mine());
  if (mine.isPending) return <LoadingState label="Loading your alerts…" />;
  if (mine.isError) return <ErrorState error={mine.error} onRetry={() => void mine.refetch()} />;
  return <AlertHistoryTable rows={mine.data} caption="Alerts mailed to you" showRecipients={false} />;
}

function EveryonesAlerts() {
  const all = useQuery(alertQueries.everyone());
  if (all.isPending) return <LoadingState label="Loading every user's alerts…" />;
  if (all.isError) return <ErrorState error={all.error} onRetry={() => void all.refetch()} />;
  return <AlertHistoryTable rows={all.data} caption="Alerts mailed to every user" showRecipients />;
}
