// The quarters the overview's control chart takes its centre line and limits from. A coordinator chooses
// them (for instance the year before a change in training); without a choice they are the first four
// quarters with attempts. Quarters after the baseline are judged against it and never move it.
import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import type { ChartBaseline } from "../../../shared/schemas/chartSettings";
import { quarterLabel } from "../../../shared/period";
import { Button } from "../../components/Button";
import { Select } from "../../components/Field";
import { Notice } from "../../components/Notice";
import { ErrorState, LoadingState, errorMessage } from "../../components/States";
import { useSaveChartBaseline } from "./mutations";
import { settingsQueries } from "./queries";

export function ChartBaselineSection({ quarters, canEdit }: { quarters: readonly string[]; canEdit: boolean }) {
  const baseline = useQuery(settingsQueries.chartBaseline());
  return (
    <section aria-labelledby="baseline-heading" className="flex flex-col gap-3 rounded-card border border-line bg-surface p-4 shadow-card">
      <h2 id="baseline-heading" className="text-title">
        Control chart baseline
      </h2>
      <p className="max-w-3xl">
        The overview's quarter-by-quarter chart draws its centre line and control limits from these quarters. Quarters after them are judged against that line
        and never move it, so a quarter's verdict does not change when newer quarters arrive.
      </p>
      {baseline.isPending ? (
        <LoadingState label="Loading the baseline…" />
      ) : baseline.isError ? (
        <ErrorState error={baseline.error} onRetry={() => baseline.refetch()} />
      ) : (
        <BaselineForm key={`${baseline.data.from}|${baseline.data.to}|${baseline.data.source}`} current={baseline.data} quarters={quarters} canEdit={canEdit} />
      )}
    </section>
  );
}

function describe(current: ChartBaseline): string {
  if (current.from === null || current.to === null) return "No quarter has attempts yet.";
  const range = `${quarterLabel(current.from)} to ${quarterLabel(current.to)}`;
  return current.source === "setting" ? `In use: ${range}, chosen by a coordinator.` : `In use: ${range}, the first four quarters with attempts (the default).`;
}

function BaselineForm({ current, quarters, canEdit }: { current: ChartBaseline; quarters: readonly string[]; canEdit: boolean }) {
  const [from, setFrom] = useState(current.from ?? "");
  const [to, setTo] = useState(current.to ?? "");
  const save = useSaveChartBaseline();
  const options = quarters.map((q) => ({ value: q, label: quarterLabel(q) }));
  const backwards = from !== "" && to !== "" && from > to;
  return (
    <div className="flex flex-col gap-3">
      <p className="font-semibold">{describe(current)}</p>
      {save.isError && <Notice tone="error">{errorMessage(save.error)}</Notice>}
      {canEdit ? (
        <>
          <div className="flex flex-wrap items-end gap-3">
            <Select label="First baseline quarter" options={options} value={from} onChange={(event) => setFrom(event.target.value)} />
            <Select
              label="Last baseline quarter"
              options={options}
              value={to}
              onChange={(event) => setTo(event.target.value)}
              error={backwards ? "The last quarter must not come before the first" : undefined}
            />
            <Button disabled={from === "" || to === "" || backwards} busy={save.isPending} onClick={() => save.mutate({ from, to })}>
              Use these quarters
            </Button>
            {current.source === "setting" && (
              <Button variant="secondary" busy={save.isPending} onClick={() => save.mutate(null)}>
                Back to the first four quarters
              </Button>
            )}
          </div>
        </>
      ) : (
        <p className="text-small text-muted">Only the regional coordinator can change the baseline.</p>
      )}
    </div>
  );
}
