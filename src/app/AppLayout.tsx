// The frame around every signed-in page: header with the product, the user and sign-out; navigation drawn
// from the route table for the user's role; the page itself in <main>.
import clsx from "clsx";
import { useEffect, useId, useRef, useState } from "react";
import { NavLink, Outlet, useLocation, useNavigate } from "react-router";
import { roleLabels } from "../../shared/domain";
import { Button } from "../components/Button";
import { Logo } from "../components/Logo";
import { useSignOut } from "../features/auth/mutations";
import { useCurrentUser } from "../features/auth/useSession";
import { RequireSession } from "./RouteGuard";
import { useRouteTable } from "./RouteTable";
import { navGroups } from "./routes";
import { useFollowDataChanges } from "./useFollowDataChanges";

export function AppLayout() {
  return (
    <RequireSession>
      <SignedInLayout />
    </RequireSession>
  );
}

export function SkipLink() {
  return (
    <a
      href="#main"
      className="sr-only z-50 rounded-control bg-marigold-500 px-4 py-2 font-semibold text-ink focus:not-sr-only focus:fixed focus:top-2 focus:left-2 focus:px-4 focus:py-2"
    >
      Skip to content
    </a>
  );
}

function SignedInLayout() {
  const user = useCurrentUser();
  const location = useLocation();
  // The path the phone menu was opened on: moving to another page closes it without an extra render.
  const [menuOpenOn, setMenuOpenOn] = useState<string | null>(null);
  const menuOpen = menuOpenOn === location.pathname;
  const navId = useId();
  const mainRef = useRef<HTMLElement>(null);
  const firstRender = useRef(true);
  useFollowDataChanges();

  // After moving to another page: put focus at the start of the new page, so keyboard and screen-reader
  // users continue from there rather than from the old link.
  useEffect(() => {
    if (firstRender.current) {
      firstRender.current = false;
      return;
    }
    mainRef.current?.focus();
  }, [location.pathname]);

  return (
    <div className="flex min-h-screen flex-col">
      <SkipLink />
      <header className="on-dark sticky top-0 z-30 bg-dusk-800 text-white shadow-raised">
        <div className="mx-auto flex max-w-page items-center gap-3 px-4 py-2 sm:px-6">
          <button
            type="button"
            className="inline-flex min-h-11 items-center gap-2 rounded-control border border-dusk-400 px-3 font-medium lg:hidden"
            aria-expanded={menuOpen}
            aria-controls={navId}
            onClick={() => setMenuOpenOn(menuOpen ? null : location.pathname)}
          >
            <svg viewBox="0 0 20 20" className="size-5" aria-hidden="true">
              {menuOpen ? (
                <path d="M5 5l10 10M15 5 5 15" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
              ) : (
                <path d="M3 5h14M3 10h14M3 15h14" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
              )}
            </svg>
            Menu
          </button>
          <NavLink to="/" className="rounded-control" aria-label="Quarterbeat, start page">
            <Logo />
          </NavLink>
          <div className="ml-auto flex items-center gap-3">
            <div className="hidden text-right leading-tight sm:block">
              <p className="text-small font-semibold">{user.displayName}</p>
              <p className="text-caption text-dusk-200">{roleLabels[user.role]}</p>
            </div>
            <SignOutButton />
          </div>
        </div>
      </header>

      <div className="mx-auto flex w-full max-w-page flex-1 flex-col lg:flex-row">
        <nav
          id={navId}
          aria-label="Main"
          className={clsx(
            "border-b border-line bg-surface px-4 py-4 lg:block lg:w-56 lg:shrink-0 lg:border-r lg:border-b-0 lg:bg-transparent",
            menuOpen ? "block" : "hidden",
          )}
        >
          <div className="mb-3 border-b border-line pb-3 sm:hidden">
            <p className="font-semibold">{user.displayName}</p>
            <p className="text-small text-muted">{roleLabels[user.role]}</p>
          </div>
          <MainNav />
        </nav>
        <main id="main" ref={mainRef} tabIndex={-1} className="min-w-0 flex-1 px-4 py-6 outline-none sm:px-6 lg:py-8">
          <Outlet />
        </main>
      </div>

      <footer className="border-t border-line px-4 py-4 text-center text-caption text-muted sm:px-6">
        Quarterbeat — CPR training quality for the network. A training-quality tool, not a medical device.
      </footer>
    </div>
  );
}

function MainNav() {
  const user = useCurrentUser();
  const { routesFor } = useRouteTable();
  const routes = routesFor(user.role).filter((route) => route.nav !== false);
  return (
    <div className="flex flex-col gap-5">
      {navGroups.map((group) => {
        const links = routes.filter((route) => route.group === group.id);
        if (links.length === 0) return null;
        return (
          <section key={group.id} aria-labelledby={`nav-${group.id}`}>
            <h2 id={`nav-${group.id}`} className="mb-1 px-3 text-caption font-semibold tracking-wide text-muted uppercase">
              {group.label}
            </h2>
            <ul className="flex flex-col gap-0.5">
              {links.map((route) => (
                <li key={route.path}>
                  <NavLink
                    to={`/${route.path}`}
                    className={({ isActive }) =>
                      clsx(
                        "flex min-h-11 items-center rounded-control border-l-4 px-3 font-medium",
                        isActive ? "border-marigold-500 bg-dusk-100 text-dusk-900" : "border-transparent text-ink hover:bg-dusk-50 hover:text-dusk-800",
                      )
                    }
                  >
                    {route.title}
                  </NavLink>
                </li>
              ))}
            </ul>
          </section>
        );
      })}
    </div>
  );
}

function SignOutButton() {
  const signOut = useSignOut();
  const navigate = useNavigate();
  return (
    <Button
      variant="secondary"
      size="sm"
      className="border-dusk-400 bg-transparent text-white hover:bg-dusk-700"
      busy={signOut.isPending}
      onClick={() => signOut.mutate(undefined, { onSettled: () => navigate("/sign-in", { replace: true }) })}
    >
      Sign out
    </Button>
  );
}
