// The client and the server read one permission table: the route table names only its permissions, and for
// every role × permission the client's useCan answers what the server's guard and row scope decide.
import { QueryClientProvider } from "@tanstack/react-query";
import { cleanup, renderHook, waitFor } from "@testing-library/react";
import type { Request, Response } from "express";
import type { ReactNode } from "react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { userRoles, type UserRole } from "../../shared/domain";
import { isPermission, permissions, type Permission } from "../../shared/permissions";
import type { CurrentUser } from "../../shared/schemas/auth";
import { allow, rowScope } from "../../server/auth/guard";
import { AppError } from "../../server/errors";
import { createQueryClient } from "../../src/app/queryClient";
import { appRoutes, rolesFor } from "../../src/app/routes";
import { useCan } from "../../src/features/auth/useCan";
import { fakeServer, sessionFor } from "./testServer";

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

/** The user sessionFor(role) answers, as the server would hold it. */
function userOf(role: UserRole): CurrentUser {
  return (sessionFor(role).body as { user: CurrentUser }).user;
}

/** What the server's route guard does with this user: true = the handler runs, false = 403. */
function serverAllows(role: UserRole, permission: Permission): boolean {
  let passed = false;
  try {
    allow(permission)({ user: userOf(role) } as Request, {} as Response, () => (passed = true));
  } catch (error) {
    if (!(error instanceof AppError) || error.status !== 403) throw error;
  }
  return passed;
}

/** Whether the server lets this user see every instructor's rows under the permission. */
function serverReachesEveryRow(role: UserRole, permission: Permission): boolean {
  return serverAllows(role, permission) && rowScope(userOf(role), permission).instructorId === null;
}

describe("the route table", () => {
  it("names only permissions of the shared table", () => {
    const named = appRoutes.flatMap((route) => (route.permission === undefined ? [] : [route.permission]));
    expect(named.length).toBeGreaterThan(10);
    expect(named.filter((name) => !isPermission(name))).toEqual([]);
  });

  it("opens every page to exactly the roles the server's guard lets through", () => {
    for (const route of appRoutes) {
      const expected = userRoles.filter((role) =>
        route.permission === undefined ? true : route.needs === "any" ? serverReachesEveryRow(role, route.permission) : serverAllows(role, route.permission),
      );
      expect(rolesFor(route), route.path).toEqual(expected);
    }
  });

  // The pages as the README's role table describes them (a regression check of the table's contents).
  it("opens the attempt list to every role that reads attempts (instructors: their own) and the standing to instructors", () => {
    const rolesOf = (path: string) => rolesFor(appRoutes.find((route) => route.path === path)!);
    expect(rolesOf("attempts")).toEqual(["coordinator", "quality_lead", "instructor"]);
    expect(rolesOf("attempts/:id")).toEqual(["coordinator", "quality_lead", "instructor"]);
    expect(rolesOf("my-standing")).toEqual(["instructor"]);
    expect(rolesOf("retention")).toEqual(["coordinator", "quality_lead"]);
    expect(rolesOf("calibration")).toEqual(["coordinator", "quality_lead", "instructor"]);
    expect(rolesOf("report")).toEqual(["coordinator", "funder"]);
    expect(rolesOf("account")).toEqual([...userRoles]);
    expect(rolesOf("alerts")).toEqual(["coordinator", "quality_lead", "instructor"]);
  });
});

describe("useCan", () => {
  it.each(userRoles)("agrees with the server for every permission, signed in as %s", async (role) => {
    fakeServer({ "GET /api/me": sessionFor(role) });
    const queryClient = createQueryClient();
    const wrapper = ({ children }: { children: ReactNode }) => <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
    // one hook call per permission and reach, in a fixed order
    const { result } = renderHook(() => permissions.map((permission) => ({ permission, own: useCan(permission), any: useCan(permission, "any") })), {
      wrapper,
    });
    // every role may read the filter options: once that is true, the session has arrived
    await waitFor(() => expect(result.current.find((row) => row.permission === "readInsightOptions")?.own).toBe(true));
    const expected = permissions.map((permission) => ({ permission, own: serverAllows(role, permission), any: serverReachesEveryRow(role, permission) }));
    expect(result.current).toEqual(expected);
    expect(expected.some((row) => row.own)).toBe(true);
  });

  it("holds nothing while signed out", () => {
    fakeServer({});
    const queryClient = createQueryClient();
    const wrapper = ({ children }: { children: ReactNode }) => <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
    const { result } = renderHook(() => useCan("readReport"), { wrapper });
    expect(result.current).toBe(false);
  });
});
