import type { Request, RequestHandler } from "express";
import type { CurrentUser } from "../../shared/schemas/auth";
import { forbidden, unauthorized } from "../errors";
import { can, reachOf, type Permission } from "../../shared/permissions";

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // passport puts the signed-in user here; only an interface merges with Express's own declaration
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends CurrentUser {}
  }
}

/** The signed-in user, or a 401. */
export function signedInUser(req: Request): CurrentUser {
  if (!req.user) throw unauthorized();
  return req.user;
}

/** Route guard: 401 when signed out, 403 when the role lacks the permission (shared/permissions.ts). */
export function allow(permission: Permission): RequestHandler {
  return (req, _res, next) => {
    const user = signedInUser(req);
    if (!can(user, permission)) throw forbidden();
    next();
  };
}

export const signedIn: RequestHandler = (req, _res, next) => {
  signedInUser(req);
  next();
};

/** Which instructor's rows a user may see in full: null = every instructor's. */
export interface RowScope {
  instructorId: number | null;
}

/** The rows a permission reaches for this user: "any" every instructor's, "own" their linked instructor's. */
export function rowScope(user: CurrentUser, permission: Permission): RowScope {
  const reach = reachOf(user.role, permission);
  if (reach === "any") return { instructorId: null };
  if (reach === "own" && user.instructorId !== null) return { instructorId: user.instructorId };
  // an account without a linked instructor, or without the permission: no identifiable rows at all
  return { instructorId: -1 };
}
