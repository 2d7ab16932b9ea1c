// The improvement actions a trend chart marks, as links to each action's page with its evaluation, so the
// dashed line on the chart leads to what was done and whether the figure moved.
import { Link } from "react-router";
import { quarterLabel } from "../../../shared/period";
import type { ActionMark } from "../../../shared/schemas/actions";
import { formatDay } from "../../lib/formatting";

export function ActionMarkList({ marks, quarters }: { marks: readonly ActionMark[]; quarters: readonly string[] }) {
  // numbered as on the chart: only actions starting in one of its quarters have a place there
  const shown = marks.filter((mark) => quarters.includes(mark.quarter));
  if (shown.length === 0) return null;
  return (
    <div className="text-small">
      <p className="font-semibold">Improvement actions on this chart (open one for its before and after)</p>
      <ul className="flex flex-col gap-1">
        {shown.map((mark, index) => (
          <li key={mark.id}>
            A{index + 1}{" "}
            <Link to={`/actions/${mark.id}`} className="font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
              {mark.title}
            </Link>{" "}
            (from {formatDay(mark.startDate)}, {quarterLabel(mark.quarter)})
          </li>
        ))}
      </ul>
    </div>
  );
}
