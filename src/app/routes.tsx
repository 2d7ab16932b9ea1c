// The route table: one line per page, with the permission it needs (shared/permissions.ts, the table the
// server's guards read too). The same table builds the router, guards every page and draws each role's
// navigation, so a role never sees a link it cannot open.
//
// To add a page:
//   1. Write the page as the default export of src/features/<feature>/<Name>Page.tsx, beside the feature's
//      queries and components.
//   2. Add one line below, in the order it should appear in the navigation, e.g.
//        { path: "overview", title: "Network overview", group: "quality", permission: "readNetwork", page: lazy(() => import("../features/insight/overview/OverviewPage")), landing: true },
//   Leave out `permission` for a page every signed-in user may open. `needs: "any"` asks for network-wide
//   reach (a page about everyone's rows). `landing: true` makes the page a candidate for "/": each role
//   starts on the first landing page (in table order) that it may use. `nav: false` hides the page from the
//   navigation but still guards it. `prefetch` starts the page's requests at navigation (the route's loader),
//   so a page that needs the filter options does not ask for its answer only after they have arrived.
import { lazy, type ComponentType, type LazyExoticComponent } from "react";
import { userRoles, type UserRole } from "../../shared/domain";
import { can, type Permission, type Reach } from "../../shared/permissions";
import { optionsPrefetch, type PagePrefetch } from "../features/insight/prefetch";
import { prefetchInstructor, prefetchInstructors, prefetchOverview, prefetchStanding } from "../features/insight/pageRequests";
import { prefetchCalibration, prefetchRetention } from "../features/learners/pageRequests";
import { prefetchTechniqueErrors } from "../features/techniqueErrors/pageRequests";

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
  /** What a role must hold to open the page; none: every signed-in user. */
  permission?: Permission;
  /** The reach the permission must have (default "own": either reach). */
  needs?: Reach;
  page: LazyExoticComponent<ComponentType>;
  /** Shown in the navigation (default true). */
  nav?: boolean;
  /** A page "/" may open for a role. */
  landing?: boolean;
  /** Starts the page's requests when the router navigates to it, before the page's code has loaded. */
  prefetch?: PagePrefetch;
}

export const appRoutes: readonly AppRoute[] = [
  {
    path: "my-standing",
    title: "My standing",
    group: "quality",
    permission: "readOwnStanding",
    page: lazy(() => import("../features/insight/standing/MyStandingPage")),
    prefetch: prefetchStanding,
    landing: true,
  },
  {
    path: "overview",
    title: "Network overview",
    group: "quality",
    permission: "readNetwork",
    page: lazy(() => import("../features/insight/overview/OverviewPage")),
    prefetch: prefetchOverview,
    landing: true,
  },
  {
    path: "instructors",
    title: "Instructors",
    group: "quality",
    permission: "drillDown",
    page: lazy(() => import("../features/insight/instructors/InstructorsPage")),
    prefetch: prefetchInstructors,
  },
  {
    path: "instructors/:id",
    title: "Instructor",
    group: "quality",
    permission: "drillDown",
    nav: false,
    page: lazy(() => import("../features/insight/instructors/InstructorDetailPage")),
    prefetch: prefetchInstructor,
  },
  {
    path: "classes/:id",
    title: "Class",
    group: "quality",
    permission: "readAttempts",
    nav: false,
    page: lazy(() => import("../features/insight/classes/ClassDetailPage")),
  },
  {
    path: "retention",
    title: "Skill retention",
    group: "quality",
    permission: "drillDown",
    page: lazy(() => import("../features/learners/RetentionPage")),
    prefetch: prefetchRetention,
  },
  {
    path: "calibration",
    title: "Judgement calibration",
    group: "quality",
    permission: "readCalibration",
    page: lazy(() => import("../features/learners/CalibrationPage")),
    prefetch: prefetchCalibration,
  },
  {
    path: "errors",
    title: "Error trends",
    group: "quality",
    permission: "drillDown",
    page: lazy(() => import("../features/techniqueErrors/TechniqueErrorsPage")),
    prefetch: prefetchTechniqueErrors,
  },
  {
    path: "attempts",
    title: "Attempts",
    group: "quality",
    permission: "readAttempts",
    page: lazy(() => import("../features/attempts/AttemptsPage")),
    prefetch: optionsPrefetch,
  },
  {
    path: "attempts/:id",
    title: "Attempt",
    group: "quality",
    permission: "readAttempts",
    nav: false,
    page: lazy(() => import("../features/attempts/AttemptDetailPage")),
  },
  { path: "actions", title: "Improvement actions", group: "quality", permission: "readActions", page: lazy(() => import("../features/actions/ActionsPage")) },
  {
    path: "actions/:id",
    title: "Improvement action",
    group: "quality",
    permission: "readActions",
    nav: false,
    page: lazy(() => import("../features/actions/ActionDetailPage")),
  },
  {
    path: "equipment",
    title: "Equipment",
    group: "quality",
    permission: "readEquipment",
    page: lazy(() => import("../features/equipment/EquipmentPage")),
    prefetch: optionsPrefetch,
  },
  {
    path: "equipment/manikins/:assetId",
    title: "Manikin",
    group: "quality",
    permission: "readEquipment",
    nav: false,
    page: lazy(() => import("../features/equipment/ManikinPage")),
    prefetch: optionsPrefetch,
  },
  {
    path: "report",
    title: "Funder report",
    group: "quality",
    permission: "readReport",
    page: lazy(() => import("../features/report/ReportPage")),
    landing: true,
  },
  { path: "imports", title: "Imports", group: "data", permission: "importData", page: lazy(() => import("../features/imports/ImportsPage")) },
  { path: "tracker", title: "Quarter tracker", group: "data", permission: "readTracker", page: lazy(() => import("../features/tracker/QuarterTrackerPage")) },
  { path: "settings", title: "Settings", group: "admin", permission: "readSettings", page: lazy(() => import("../features/settings/SettingsPage")) },
  { path: "admin/users", title: "Users", group: "admin", permission: "manageUsers", page: lazy(() => import("../features/users/UsersAdminPage")) },
  {
    path: "admin/sites",
    title: "Sites and instructors",
    group: "admin",
    permission: "manageSites",
    page: lazy(() => import("../features/sites/SitesAdminPage")),
  },
  { path: "outbox", title: "Outbox", group: "admin", permission: "sendReport", page: lazy(() => import("../features/outbox/OutboxPage")) },
  { path: "system", title: "System", group: "admin", permission: "readSystem", page: lazy(() => import("../features/system/SystemPage")) },
  { path: "alerts", title: "Alerts", group: "you", permission: "receiveImportAlerts", page: lazy(() => import("../features/alerts/AlertsPage")) },
  { path: "methods", title: "Methods", group: "quality", page: lazy(() => import("../features/methods/MethodsPage")) },
  { path: "account", title: "My account", group: "you", page: lazy(() => import("../features/auth/AccountPage")), landing: true },
  // Development builds only: a gallery of the UI kit.
  ...(import.meta.env.DEV
    ? [{ path: "kit", title: "UI kit", group: "you" as const, nav: false, page: lazy(() => import("../features/kit/KitPreviewPage")) }]
    : []),
];

/** Whether a role may open a page of the table. */
export function mayOpen(route: AppRoute, role: UserRole): boolean {
  return route.permission === undefined || can(role, route.permission, route.needs);
}

/** The roles that may open a page (for "open to … accounts"); every role when it needs no permission. */
export function rolesFor(route: AppRoute): UserRole[] {
  return userRoles.filter((role) => mayOpen(route, role));
}

/** Where "/" sends a role: its first landing page, or its first page of any kind (never one that needs an id). */
export function homePathFor(role: UserRole, routes: readonly AppRoute[] = appRoutes): string {
  const allowed = routes.filter((route) => mayOpen(route, role) && !route.path.includes(":"));
  const landing = allowed.find((route) => route.landing) ?? allowed[0];
  return landing ? `/${landing.path}` : "/account";
}

export function routesFor(role: UserRole, routes: readonly AppRoute[] = appRoutes): AppRoute[] {
  return routes.filter((route) => mayOpen(route, role));
}
