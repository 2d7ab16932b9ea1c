// Builds the router from the route table. Tests call buildRoutes() with a memory router and their own query
// client. A page with a `prefetch` gets a loader that starts its requests at navigation and returns at once:
// the page and its guard render as before (loading, sign-in, "not available"), the requests already on their way.
import type { QueryClient } from "@tanstack/react-query";
import { Navigate, Outlet, type LoaderFunctionArgs, type RouteObject } from "react-router";
import { PageHeader } from "../components/PageHeader";
import { LoadingState } from "../components/States";
import { authQueries } from "../features/auth/queries";
import { useSession } from "../features/auth/useSession";
import SignInPage from "../features/auth/SignInPage";
import { AppLayout } from "./AppLayout";
import { RouteErrorPage } from "./RouteErrorPage";
import { RouteGuard, useDocumentTitle } from "./RouteGuard";
import { RouteTableProvider, useRouteTable } from "./RouteTable";
import { appRoutes, mayOpen, type AppRoute } from "./routes";

function HomeRedirect() {
  const session = useSession();
  const { homePathFor } = useRouteTable();
  if (!session.data) return <LoadingState />;
  return <Navigate to={homePathFor(session.data.user.role)} replace />;
}

function NotFoundPage() {
  useDocumentTitle("Page not found");
  return (
    <div>
      <PageHeader title="Page not found" description="This address does not lead to a Quarterbeat page. Check the link, or use the navigation." />
    </div>
  );
}

/** The loader of a page with a prefetch. A visitor known to be signed out, or whose role may not open the page, is left to the guard without a request. */
function prefetchLoader(queryClient: QueryClient, route: AppRoute, prefetch: NonNullable<AppRoute["prefetch"]>) {
  return ({ request, params }: LoaderFunctionArgs) => {
    // undefined: the session is still being asked for, and the page's requests go out beside it
    const session = queryClient.getQueryData(authQueries.me().queryKey);
    const leftToGuard = session === null || (session !== undefined && !mayOpen(route, session.user.role));
    if (!leftToGuard) prefetch(queryClient, { search: new URL(request.url).searchParams, params });
    return null;
  };
}

function pageRoute(queryClient: QueryClient, route: AppRoute): RouteObject {
  const page: RouteObject = { path: route.path, element: <RouteGuard route={route} /> };
  if (!route.prefetch) return page;
  // shown while the loader runs on the first load, as the guard's own fallback would be
  return {
    ...page,
    loader: prefetchLoader(queryClient, route, route.prefetch),
    hydrateFallbackElement: <LoadingState label={`Opening ${route.title.toLowerCase()}…`} />,
  };
}

export function buildRoutes(queryClient: QueryClient, routes: readonly AppRoute[] = appRoutes): RouteObject[] {
  return [
    {
      element: (
        <RouteTableProvider routes={routes}>
          <Outlet />
        </RouteTableProvider>
      ),
      errorElement: <RouteErrorPage />,
      children: [
        { path: "/sign-in", element: <SignInPage /> },
        {
          path: "/",
          element: <AppLayout />,
          errorElement: <RouteErrorPage />,
          children: [
            { index: true, element: <HomeRedirect /> },
            ...routes.map((route) => pageRoute(queryClient, route)),
            { path: "*", element: <NotFoundPage /> },
          ],
        },
      ],
    },
  ];
}
