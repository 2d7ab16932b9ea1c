// Lets a reader split the overview's control chart at an improvement action's start, so the quarters after it
// are judged as a phase of their own. The choice is kept in the URL (?split=YYYY-MM-DD) so a link shows the
// same chart; only actions marked on the chart are offered.
import { useId } from "react";
import { useSearchParam } from "../../../lib/useSearchParam";
import type { ActionMark } from "../../../../shared/schemas/actions";
import { formatDay } from "../../../lib/formatting";
import { controlClass } from "../../../components/Field";

export function ChartSplitChoice({ actions }: { actions: readonly ActionMark[] }) {
  const id = useId();
  const [split, setSplit] = useSearchParam("split");
  const current = split ?? "";
  // a split chosen from a link whose action is not on this chart is still offered, so it can be cleared
  const offered =
    actions.some((action) => action.startDate === current) || current === ""
      ? actions
      : [...actions, { id: -1, title: "a date from the link", startDate: current, quarter: "" }];
  if (offered.length === 0) return null;
  const choose = (date: string) => setSplit(date === "" ? null : date);
  return (
    <div className="flex max-w-xl flex-col gap-1 text-small">
      <label htmlFor={id} className="text-ink">
        Split the chart at an improvement action
      </label>
      <select id={id} value={current} onChange={(event) => choose(event.target.value)} className={controlClass(false)}>
        <option value="">No split: one centre line</option>
        {offered.map((action) => (
          <option key={`${action.id}-${action.startDate}`} value={action.startDate}>
            {action.title} (from {formatDay(action.startDate)})
          </option>
        ))}
      </select>
    </div>
  );
}
