// The route table: one line per page, with the roles that may use it. The same table builds the router,
// guards every page and draws each role's navigation, so a role never sees a link it cannot open.
//
// To add a page:
//   1. Write the page as the default export of src/pages/<Name>Page.tsx.
//   2. Add one line below, in the order it should appear in the navigation, e.g.
//        { path: "overview", title: "Network overview", group: "quality", roles: ["coordinator", "quality_lead", "funder"], page: lazy(() => import("../pages/OverviewPage")), landing: true },
//   `landing: true` makes the page a candidate for "/": each role starts on the first landing page (in
//   table order) that it may use. `nav: false` hides the page from the navigation but still guards it.
import { lazy, type ComponentType, type LazyExoticComponent } from "react";
import { userRoles, type UserRole } from "../../shared/domain";

export type NavGroup = "quality" | "data" | "admin" | "you";

/** Navigation sections, in the order they appear. */
export const navGroups: readonly { id: NavGroup; label: string }[] = [
  { id: "quality", label: "Quality" },
  { id: "data", label: "Data" },
  { id: "admin", label: "Administration" },
  { id: "you", label: "You" },
];

export interface AppRoute {
  /** URL path without the leading slash. */
  path: string;
  /** Navigation label and browser tab title. */
  title: string;
  group: NavGroup;
  roles: readonly UserRole[];
  page: LazyExoticComponent<ComponentType>;
  /** Shown in the navigation (default true). */
  nav?: boolean;
  /** A page "/" may open for a role. */
  landing?: boolean;
}

const everyone = userRoles;

export const appRoutes: readonly AppRoute[] = [
  { path: "my-standing", title: "My standing", group: "quality", roles: ["instructor"], page: lazy(() => import("../pages/MyStandingPage")), landing: true },
  { path: "overview", title: "Network overview", group: "quality", roles: ["coordinator", "quality_lead", "instructor"], page: lazy(() => import("../pages/OverviewPage")), landing: true },
  { path: "instructors", title: "Instructors", group: "quality", roles: ["coordinator", "quality_lead"], page: lazy(() => import("../pages/InstructorsPage")) },
  { path: "instructors/:id", title: "Instructor", group: "quality", roles: ["coordinator", "quality_lead"], nav: false, page: lazy(() => import("../pages/InstructorDetailPage")) },
  { path: "classes/:id", title: "Class", group: "quality", roles: ["coordinator", "quality_lead", "instructor"], nav: false, page: lazy(() => import("../pages/ClassDetailPage")) },
  { path: "errors", title: "Error trends", group: "quality", roles: ["coordinator", "quality_lead"], page: lazy(() => import("../pages/ErrorTrendsPage")) },
  { path: "attempts", title: "Attempts", group: "quality", roles: ["coordinator", "quality_lead"], page: lazy(() => import("../pages/AttemptsPage")) },
  { path: "attempts/:id", title: "Attempt", group: "quality", roles: ["coordinator", "quality_lead", "instructor"], nav: false, page: lazy(() => import("../pages/AttemptDetailPage")) },
  { path: "equipment", title: "Equipment", group: "quality", roles: ["coordinator", "quality_lead", "instructor"], page: lazy(() => import("../pages/EquipmentPage")) },
  { path: "report", title: "Funder report", group: "quality", roles: ["coordinator", "funder"], page: lazy(() => import("../pages/ReportPage")), landing: true },
  { path: "imports", title: "Imports", group: "data", roles: ["coordinator", "instructor"], page: lazy(() => import("../pages/ImportsPage")) },
  { path: "settings", title: "Settings", group: "admin", roles: ["coordinator", "quality_lead"], page: lazy(() => import("../pages/SettingsPage")) },
  { path: "admin/users", title: "Users", group: "admin", roles: ["coordinator"], page: lazy(() => import("../pages/UsersAdminPage")) },
  { path: "admin/sites", title: "Sites and instructors", group: "admin", roles: ["coordinator"], page: lazy(() => import("../pages/SitesAdminPage")) },
  { path: "outbox", title: "Outbox", group: "admin", roles: ["coordinator"], page: lazy(() => import("../pages/OutboxPage")) },
  { path: "account", title: "My account", group: "you", roles: everyone, page: lazy(() => import("../pages/AccountPage")), landing: true },
  // Development builds only: a gallery of the UI kit.
  ...(import.meta.env.DEV
    ? [{ path: "kit", title: "UI kit", group: "you" as const, roles: everyone, nav: false, page: lazy(() => import("../pages/dev/KitPreviewPage")) }]
    : []),
];

/** Where "/" sends a role: its first landing page, or its first page of any kind (never one that needs an id). */
export function homePathFor(role: UserRole, routes: readonly AppRoute[] = appRoutes): string {
  const allowed = routes.filter((route) => route.roles.includes(role) && !route.path.includes(":"));
  const landing = allowed.find((route) => route.landing) ?? allowed[0];
  return landing ? `/${landing.path}` : "/account";
}

export function routesFor(role: UserRole, routes: readonly AppRoute[] = appRoutes): AppRoute[] {
  return routes.filter((route) => route.roles.includes(role));
}
