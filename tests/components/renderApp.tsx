import { QueryClientProvider } from "@tanstack/react-query";
import { configure, render } from "@testing-library/react";
import { RouterProvider, createMemoryRouter } from "react-router";
import { setCsrfToken } from "../../src/api/http";
import { createQueryClient } from "../../src/app/queryClient";
import { buildRoutes } from "../../src/app/router";
import { appRoutes, type AppRoute } from "../../src/app/routes";

// Pages load lazily; on a busy machine the first import of a page can take a few seconds.
configure({ asyncUtilTimeout: 5000 });

/** The whole client at one address, with its real router, guards and query client. */
export function renderApp(path: string, routes: readonly AppRoute[] = appRoutes) {
  setCsrfToken(null);
  const queryClient = createQueryClient();
  const router = createMemoryRouter(buildRoutes(queryClient, routes), { initialEntries: [path] });
  const view = render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return { ...view, router, queryClient };
}
