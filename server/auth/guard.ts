import type { Request, RequestHandler } from "express";
import type { CurrentUser } from "../../shared/schemas/auth";
import { forbidden, unauthorized } from "../errors";
import { roleMay, type Permission } from "./permissions";

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // passport puts the signed-in user here
    interface User extends CurrentUser {}
  }
}

/** The signed-in user, or a 401. */
export function signedInUser(req: Request): CurrentUser {
  if (!req.user) throw unauthorized();
  return req.user;
}

/** Route guard: 401 when signed out, 403 when the role lacks the permission. */
export function allow(permission: Permission): RequestHandler {
  return (req, _res, next) => {
    const user = signedInUser(req);
    if (!roleMay(user.role, permission)) throw forbidden();
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

export function rowScope(user: CurrentUser): RowScope {
  if (user.role === "coordinator" || user.role === "quality_lead") return { instructorId: null };
  if (user.role === "instructor" && user.instructorId !== null) return { instructorId: user.instructorId };
  // an instructor account without a linked instructor, or a funder: no identifiable rows at all
  return { instructorId: -1 };
}
