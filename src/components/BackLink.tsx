// "← All instructors", "← Equipment": back to a list page with the filters the user came with (the same search
// parameters, which the detail page keeps in its own address).
import { Link, useSearchParams } from "react-router";

export function BackLink({ to, label }: { to: string; label: string }) {
  const [params] = useSearchParams();
  const search = params.toString() ? `?${params.toString()}` : "";
  return (
    <Link
      to={`${to}${search}`}
      className="mb-3 inline-flex min-h-9 items-center gap-1 font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900"
    >
      <span aria-hidden="true">←</span> {label}
    </Link>
  );
}
