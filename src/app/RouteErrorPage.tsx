// Shown when a page crashes while rendering: a way back instead of a blank screen.
import { Link, useRouteError } from "react-router";

export function RouteErrorPage() {
  const error = useRouteError();
  console.error(error);
  return (
    <div role="alert" className="mx-auto mt-16 flex max-w-xl flex-col gap-3 rounded-card border border-danger-line bg-surface p-6 shadow-card">
      <h1 className="text-title text-danger-text">This page stopped working</h1>
      <p>Something unexpected happened while showing this page. Your data is safe; reloading usually helps.</p>
      <div className="flex gap-4">
        <button type="button" onClick={() => window.location.reload()} className="font-semibold text-dusk-700 underline underline-offset-2">
          Reload the page
        </button>
        <Link to="/" className="font-semibold text-dusk-700 underline underline-offset-2">
          Go to the start page
        </Link>
      </div>
    </div>
  );
}
