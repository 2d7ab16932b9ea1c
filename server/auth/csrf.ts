// Double-submit CSRF tokens bound to the session: state-changing requests must echo the token in a header.
import { doubleCsrf } from "csrf-csrf";
import { AppError } from "../errors";

export function createCsrf(secret: string, production: boolean) {
  return doubleCsrf({
    getSecret: () => secret,
    getSessionIdentifier: (req) => req.session.id,
    cookieName: production ? "__Host-qb.csrf" : "qb.csrf",
    cookieOptions: { sameSite: "lax", secure: production, httpOnly: true, path: "/" },
    getCsrfTokenFromRequest: (req) => req.headers["x-csrf-token"],
    errorConfig: { statusCode: 403, message: "csrf", code: "EBADCSRFTOKEN" },
  });
}

export const csrfRefused = () =>
  new AppError("csrf", 403, "The form's security token is missing or out of date. Reload the page and try again.");
