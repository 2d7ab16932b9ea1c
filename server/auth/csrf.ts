// Double-submit CSRF tokens bound to the session: state-changing requests must echo the token in a header.
import type { CookieOptions } from "express";
import { doubleCsrf } from "csrf-csrf";
import { apiErrorCodes } from "../../shared/errorCodes";
import { AppError } from "../errors";

/** The token cookie's name and flags; sign-out clears it with the same ones, or the browser keeps it. */
export function csrfCookie(production: boolean): { name: string; options: CookieOptions } {
  return {
    name: production ? "__Host-qb.csrf" : "qb.csrf",
    options: { sameSite: "lax", secure: production, httpOnly: true, path: "/" },
  };
}

export function createCsrf(secret: string, production: boolean) {
  const cookie = csrfCookie(production);
  return doubleCsrf({
    getSecret: () => secret,
    getSessionIdentifier: (req) => req.session.id,
    cookieName: cookie.name,
    cookieOptions: cookie.options,
    getCsrfTokenFromRequest: (req) => req.headers["x-csrf-token"],
    errorConfig: { statusCode: 403, message: "csrf", code: "EBADCSRFTOKEN" },
  });
}

export const csrfRefused = () => new AppError(apiErrorCodes.csrf, 403, "The form's security token is missing or out of date. Reload the page and try again.");
