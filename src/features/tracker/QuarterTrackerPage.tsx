// The coordinator's quarter tracker: for one quarter, whether each instructor's class log and attempts have
// arrived, when their class log was last imported, and how many refused rows still wait to be fixed.
import { useQuery } from "@tanstack/react-query";
import { useSearchParams } from "react-router";
import { isQuarter, quarterLabel, quarterOfLocalDate, shiftQuarter } from "../../../shared/period";
import type { TrackerRow } from "../../../shared/schemas/tracker";
import { dimensionNames } from "../../../shared/vocabulary";
import { DataTable, type Column } from "../../components/DataTable";
import { Select } from "../../components/Field";
import { Notice } from "../../components/Notice";
import { PageHeader } from "../../components/PageHeader";
import { ErrorState, LoadingState } from "../../components/States";
import { formatDay } from "../../lib/formatting";
import { trackerQueries } from "./queries";

const arrived = (count: number, unit: string) => (count > 0 ? `Arrived (${count} ${unit})` : "Missing");

const columns: Column<TrackerRow>[] = [
  {
    key: "code",
    header: dimensionNames.instructor,
    value: (r) => r.code,
    render: (r) => <span className="font-mono text-small">{r.code}</span>,
    primary: true,
  },
  { key: "name", header: "Name", value: (r) => r.name },
  { key: "site", header: dimensionNames.site, value: (r) => r.siteCode ?? "" },
  {
    key: "classes",
    header: "Class log",
    value: (r) => arrived(r.classes, r.classes === 1 ? "class" : "classes"),
    render: (r) => <Status count={r.classes} text={arrived(r.classes, r.classes === 1 ? "class" : "classes")} />,
  },
  {
    key: "attempts",
    header: "Attempts",
    value: (r) => arrived(r.attempts, "measured"),
    render: (r) => <Status count={r.attempts} text={arrived(r.attempts, "measured")} />,
  },
  {
    key: "lastImportAt",
    header: "Class log last imported",
    value: (r) => r.lastImportAt,
    render: (r) => (r.lastImportAt ? formatDay(r.lastImportAt) : "Never"),
  },
  { key: "rejectedRows", header: "Refused rows to fix", value: (r) => r.rejectedRows, align: "right" },
];

function Status({ count, text }: { count: number; text: string }) {
  return <span className={count > 0 ? "text-ink" : "font-semibold text-danger-text"}>{text}</span>;
}

export default function QuarterTrackerPage() {
  const [params, setParams] = useSearchParams();
  const current = quarterOfLocalDate(new Date());
  const asked = params.get("quarter");
  const quarter = asked && isQuarter(asked) ? asked : current;
  const choices = Array.from({ length: 8 }, (_, i) => shiftQuarter(current, -i)).map((q) => ({ value: q, label: quarterLabel(q) }));
  const tracker = useQuery(trackerQueries.quarter(quarter));
  const missing = tracker.data?.instructors.filter((r) => r.active && (r.classes === 0 || r.attempts === 0)).length ?? 0;
  return (
    <div>
      <PageHeader
        title="Quarter tracker"
        description="Which instructors' class logs and attempt files have arrived for the quarter, and the refused rows still waiting to be fixed."
      />
      <Select
        label="Quarter"
        name="quarter"
        className="mb-4 max-w-xs"
        options={choices.some((c) => c.value === quarter) ? choices : [{ value: quarter, label: quarterLabel(quarter) }, ...choices]}
        value={quarter}
        onChange={(event) => setParams({ quarter: event.target.value })}
      />
      {tracker.isPending ? (
        <LoadingState label={`Loading ${quarterLabel(quarter)}…`} />
      ) : tracker.isError ? (
        <ErrorState error={tracker.error} title="The tracker could not be loaded" onRetry={() => tracker.refetch()} />
      ) : (
        <div className="flex flex-col gap-4">
          <p>
            {missing === 0
              ? `Every active instructor's files for ${quarterLabel(quarter)} have arrived.`
              : `${missing} active instructor${missing === 1 ? " has" : "s have"} files missing for ${quarterLabel(quarter)}.`}
          </p>
          {tracker.data.unassignedRejectedRows > 0 && (
            <Notice tone="info">
              {tracker.data.unassignedRejectedRows} refused row{tracker.data.unassignedRejectedRows === 1 ? "" : "s"} name no known instructor or class (for
              example from files whose columns were renamed); find them in the import history.
            </Notice>
          )}
          <DataTable
            caption={`Files of ${quarterLabel(quarter)}`}
            captionHidden
            columns={columns}
            rows={tracker.data.instructors}
            rowKey={(r) => r.instructorId}
            initialSort={{ key: "code", direction: "asc" }}
            exportFileName={`quarterbeat-tracker-${quarter}`}
            emptyMessage="No instructors yet."
          />
        </div>
      )}
    </div>
  );
}
