// The route table the router was built from, for the parts that draw from it (navigation, "/" and the
// page after sign-in). Tests build the router from a table of their own and everything follows it.
import { createContext, useContext, type ReactNode } from "react";
import type { UserRole } from "../../shared/domain";
import { appRoutes, homePathFor, routesFor, type AppRoute } from "./routes";

const RouteTableContext = createContext<readonly AppRoute[]>(appRoutes);

export function RouteTableProvider({ routes, children }: { routes: readonly AppRoute[]; children: ReactNode }) {
  return <RouteTableContext.Provider value={routes}>{children}</RouteTableContext.Provider>;
}

export function useRouteTable() {
  const routes = useContext(RouteTableContext);
  return {
    routes,
    homePathFor: (role: UserRole) => homePathFor(role, routes),
    routesFor: (role: UserRole) => routesFor(role, routes),
  };
}
