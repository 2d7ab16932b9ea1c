// Retention (coordinator, quality lead): whether learners who come back for recertification pass their first
// attempt, by months since their previous class — the network's own evidence for when refreshers are due.
import { useQuery } from "@tanstack/react-query";
import { PageHeader } from "../../components/PageHeader";
import { InsightFilters } from "../insight/InsightFilters";
import { QueryStatus } from "../insight/QueryStatus";
import type { InsightFilterState } from "../insight/useInsightFilters";
import { learnerQueries } from "./queries";
import { retentionFilters } from "./pageRequests";
import { RetentionView } from "./RetentionView";

export default function RetentionPage() {
  return (
    <div>
      <PageHeader
        title="Skill retention"
        description="Learners come back for recertification under the same learner code. How often their first attempt in the new class passes, by months since their previous class, shows how fast skills fade. Learners on their first course in the data are shown beside them."
      />
      <InsightFilters optional={retentionFilters} ranges label="Filter skill retention">
        {(state) => <Retention state={state} />}
      </InsightFilters>
    </div>
  );
}

function Retention({ state }: { state: InsightFilterState }) {
  const query = useQuery(learnerQueries.retention(state.api));
  return (
    <div className="flex flex-col gap-4">
      <p className="text-small text-muted">
        The period picks the returning (or first) class by its date; the previous class may be earlier. Months are days ÷ 30.4375. Choose a longer period (last
        4 quarters, all quarters) for more returns per group.
      </p>
      <QueryStatus query={query} loadingLabel="Loading returning learners…" errorTitle="Skill retention could not be loaded">
        {(answer) => <RetentionView answer={answer} />}
      </QueryStatus>
    </div>
  );
}
