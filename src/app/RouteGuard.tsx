// Guards one page of the route table: signed-out visitors go to sign-in (and come back afterwards); a role
// without access sees why, instead of a blank screen.
import { Suspense, useEffect } from "react";
import { Link, Navigate, useLocation } from "react-router";
import { roleLabels } from "../../shared/domain";
import { PageHeader } from "../components/PageHeader";
import { ErrorState, LoadingState } from "../components/States";
import { useSession } from "../features/auth/useSession";
import { mayOpen, rolesFor, type AppRoute } from "./routes";

export function signInPathFor(location: { pathname: string; search: string }): string {
  const back = `${location.pathname}${location.search}`;
  return back === "/" ? "/sign-in" : `/sign-in?next=${encodeURIComponent(back)}`;
}

export function useDocumentTitle(title: string) {
  useEffect(() => {
    document.title = `${title} · Quarterbeat`;
  }, [title]);
}

/** Renders children only for a signed-in user; otherwise sends them to sign in. */
export function RequireSession({ children }: { children: React.ReactNode }) {
  const session = useSession();
  const location = useLocation();
  if (session.isPending) return <LoadingState label="Checking your session…" />;
  if (session.isError) return <ErrorState error={session.error} title="Quarterbeat could not check your session" onRetry={() => session.refetch()} />;
  if (!session.data) return <Navigate to={signInPathFor(location)} replace />;
  return <>{children}</>;
}

export function RouteGuard({ route }: { route: AppRoute }) {
  const session = useSession();
  const location = useLocation();
  useDocumentTitle(route.title);
  if (session.isPending) return <LoadingState label="Checking your session…" />;
  if (session.isError) return <ErrorState error={session.error} onRetry={() => session.refetch()} />;
  if (!session.data) return <Navigate to={signInPathFor(location)} replace />;
  if (!mayOpen(route, session.data.user.role)) return <NotAvailable route={route} />;
  const Page = route.page;
  return (
    <Suspense fallback={<LoadingState label={`Opening ${route.title.toLowerCase()}…`} />}>
      <Page />
    </Suspense>
  );
}

function NotAvailable({ route }: { route: AppRoute }) {
  const session = useSession();
  const role = session.data?.user.role;
  return (
    <div>
      <PageHeader title="Not available for your role" />
      <div className="flex max-w-2xl flex-col gap-3 rounded-card border border-line bg-surface p-6 shadow-card">
        <p>
          <strong>{route.title}</strong> is open to{" "}
          {rolesFor(route)
            .map((r) => roleLabels[r])
            .join(", ")
            .replace(/, ([^,]*)$/, " and $1")}{" "}
          accounts. You are signed in as {role ? roleLabels[role].toLowerCase() : "another role"}.
        </p>
        <p className="text-muted">If you need this page for your work, ask your regional coordinator to change your role.</p>
        <Link to="/" className="self-start font-semibold text-dusk-700 underline underline-offset-2 hover:text-dusk-900">
          Go to your start page
        </Link>
      </div>
    </div>
  );
}
