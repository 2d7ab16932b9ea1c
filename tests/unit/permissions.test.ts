// The permission table (shared/permissions.ts) and the server's reading of it: reach, row scope, roles.
import { describe, expect, it } from "vitest";
import { userRoles } from "../../shared/domain";
import { can, isPermission, permissions, permissionTable, reachOf, rolesWith } from "../../shared/permissions";
import type { CurrentUser } from "../../shared/schemas/auth";
import { rowScope } from "../../server/auth/guard";

function user(role: CurrentUser["role"], instructorId: number | null = null): CurrentUser {
  return { id: 1, email: "robin@example.org", displayName: "Robin", role, instructorId, siteId: null, lengthUnit: "mm" };
}

describe("permission table", () => {
  it("grants only known roles, each with 'any' or 'own'", () => {
    for (const permission of permissions) {
      for (const [role, reach] of Object.entries(permissionTable[permission])) {
        expect(userRoles as readonly string[]).toContain(role);
        expect(["any", "own"]).toContain(reach);
      }
    }
  });

  // README "Roles": the coordinator may do everything; "my standing" is an instructor's own page.
  it("gives the coordinator network-wide reach for everything but an instructor's own standing", () => {
    const held = permissions.filter((p) => reachOf("coordinator", p) === "any");
    expect(held).toEqual(permissions.filter((p) => p !== "readOwnStanding"));
  });

  // README "Roles": an instructor reads their own classes and attempts in full, of everyone else only aggregates.
  it("limits an instructor to their own rows and a funder to the report", () => {
    expect(reachOf("instructor", "readAttempts")).toBe("own");
    expect(reachOf("instructor", "readNetwork")).toBe("any");
    expect(reachOf("instructor", "drillDown")).toBeNull();
    expect(permissions.filter((p) => can("funder", p))).toEqual(["readInsightOptions", "watchDataVersion", "readReport"]);
  });

  it("answers 'own' questions for either reach and 'any' questions only for network-wide reach", () => {
    expect(can(user("instructor"), "importData")).toBe(true);
    expect(can(user("instructor"), "importData", "any")).toBe(false);
    expect(can(user("coordinator"), "importData", "any")).toBe(true);
    expect(can("quality_lead", "importData")).toBe(false);
  });

  it("lists the roles holding a permission in the order of the roles", () => {
    expect(rolesWith("readReport")).toEqual(["coordinator", "funder"]);
    expect(rolesWith("readAttempts")).toEqual(["coordinator", "quality_lead", "instructor"]);
  });

  it("recognises permission names", () => {
    expect(isPermission("readReport")).toBe(true);
    expect(isPermission("toString")).toBe(false);
    expect(isPermission("readEverything")).toBe(false);
  });
});

describe("row scope from the table", () => {
  it("gives 'any' reach every instructor's rows and 'own' reach the linked instructor's", () => {
    expect(rowScope(user("quality_lead"), "readAttempts")).toEqual({ instructorId: null });
    expect(rowScope(user("instructor", 7), "readAttempts")).toEqual({ instructorId: 7 });
    expect(rowScope(user("instructor", 7), "readEquipment")).toEqual({ instructorId: 7 });
  });

  it("gives no identifiable rows to an unlinked instructor or a role without the permission", () => {
    expect(rowScope(user("instructor", null), "readAttempts")).toEqual({ instructorId: -1 });
    expect(rowScope(user("funder"), "readAttempts")).toEqual({ instructorId: -1 });
  });
});
