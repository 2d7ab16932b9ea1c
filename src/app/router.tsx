// Builds the router from the route table. Tests call buildRoutes() with a memory router.
import { Navigate, Outlet, type RouteObject } from "react-router";
import { PageHeader } from "../components/PageHeader";
import { LoadingState } from "../components/States";
import { useSession } from "../features/auth/useSession";
import SignInPage from "../features/auth/SignInPage";
import { AppLayout } from "./AppLayout";
import { RouteErrorPage } from "./RouteErrorPage";
import { RouteGuard, useDocumentTitle } from "./RouteGuard";
import { RouteTableProvider, useRouteTable } from "./RouteTable";
import { appRoutes, type AppRoute } from "./routes";

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

export function buildRoutes(routes: readonly AppRoute[] = appRoutes): RouteObject[] {
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
            ...routes.map((route) => ({ path: route.path, element: <RouteGuard route={route} /> })),
            { path: "*", element: <NotFoundPage /> },
          ],
        },
      ],
    },
  ];
}
