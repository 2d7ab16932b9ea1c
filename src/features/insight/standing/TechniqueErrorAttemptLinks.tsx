// Under "Your errors": each error of my profile, most common first, as a link to my own attempts with that
// error in the attempt list, with the period and filters of the standing page.
import { Link } from "react-router";
import type { AttemptError } from "../../../../shared/scoring/scoreAttempt";
import { errorShortNames } from "../../../../shared/vocabulary";
import type { TechniqueErrorProfileRow } from "../charts/TechniqueErrorProfileChart";
import { formatPercent } from "../format";

export function TechniqueErrorAttemptLinks({
  rows,
  attemptsHref,
}: {
  rows: readonly TechniqueErrorProfileRow[];
  attemptsHref: (error: AttemptError) => string;
}) {
  const mine = [...rows].filter((r) => r.mine !== null).sort((a, b) => (b.mine ?? 0) - (a.mine ?? 0));
  if (mine.length === 0) return null;
  return (
    <nav aria-labelledby="error-attempts-heading" className="rounded-card border border-line bg-surface p-4 shadow-card">
      <h3 id="error-attempts-heading" className="text-small font-semibold">
        Open your attempts with an error
      </h3>
      <ul className="mt-2 grid gap-x-6 gap-y-1 text-small sm:grid-cols-2 lg:grid-cols-3">
        {mine.map((r) => (
          <li key={r.error}>
            {r.mine ? (
              <Link
                to={attemptsHref(r.error)}
                className="inline-flex min-h-8 items-center font-medium text-dusk-700 underline underline-offset-2 hover:text-dusk-900"
              >
                {errorShortNames[r.error]}
              </Link>
            ) : (
              <span className="inline-flex min-h-8 items-center text-muted">{errorShortNames[r.error]}</span>
            )}{" "}
            <span className="text-muted">— {formatPercent(r.mine)} of your attempts</span>
          </li>
        ))}
      </ul>
    </nav>
  );
}
