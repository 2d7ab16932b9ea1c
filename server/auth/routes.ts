import { Router, type CookieOptions, type Request, type Response } from "express";
import type passport from "passport";
import { changePasswordSchema, preferencesSchema, signInSchema, type CurrentUser } from "../../shared/schemas/auth";
import { apiErrorCodes } from "../../shared/errorCodes";
import type { Db } from "../db/client";
import { AppError } from "../errors";
import { parseWith } from "../http/validate";
import { findActiveUser, findUserForSignIn, setLengthUnit, setPassword } from "../users/service";
import { signedIn, signedInUser } from "./guard";
import { logIn, type EndSessionsAfterPasswordChange } from "./passwordChangeSessions";
import { verifyPassword } from "./passwords";
import { countAsGuess, passwordGuessLimits, typedEmail, type SignInLimit } from "./signInLimits";

interface Deps {
  db: Db;
  passport: passport.Authenticator;
  csrfToken: (req: Request, res: Response) => string;
  /** The token cookie, cleared at sign-out. */
  csrfCookie: { name: string; options: CookieOptions };
  endSessionsAfterPasswordChange: EndSessionsAfterPasswordChange;
  signInLimit: SignInLimit;
}

export function authRoutes({ db, passport, csrfToken, csrfCookie, endSessionsAfterPasswordChange, signInLimit }: Deps): Router {
  const router = Router();
  const signInLimits = passwordGuessLimits(signInLimit, typedEmail);
  const passwordChangeLimits = passwordGuessLimits(signInLimit, (req) => signedInUser(req).email);

  router.get("/auth/csrf", (req, res) => {
    // mark the session so it is saved and the token's session id stays the same until sign-in
    req.session.csrfIssued = true;
    res.json({ csrfToken: csrfToken(req, res) });
  });

  router.post("/auth/login", ...signInLimits, async (req, res) => {
    const credentials = parseWith(signInSchema, req.body, "The sign-in form");
    const user = await new Promise<CurrentUser | false>((resolve, reject) => {
      req.body = credentials;
      passport.authenticate("local", (err: unknown, found: CurrentUser | false) => (err ? reject(err) : resolve(found)))(req, res, () => {});
    });
    if (!user) {
      countAsGuess(res);
      throw new AppError(apiErrorCodes.invalidCredentials, 401, "The e-mail or password is not right.");
    }
    await logIn(req, user);
    res.json({ user, csrfToken: csrfToken(req, res) });
  });

  router.post("/auth/logout", (req, res, next) => {
    req.logOut((err) => {
      if (err) return next(err);
      req.session.destroy(() => {
        res.clearCookie("qb.sid");
        res.clearCookie(csrfCookie.name, csrfCookie.options);
        res.status(204).end();
      });
    });
  });

  router.get("/me", (req, res) => {
    const user = signedInUser(req);
    res.json({ user, csrfToken: csrfToken(req, res) });
  });

  router.patch("/me", signedIn, (req, res) => {
    const user = signedInUser(req);
    const { lengthUnit } = parseWith(preferencesSchema, req.body, "The preferences");
    setLengthUnit(db, user.id, lengthUnit);
    res.json({ user: findActiveUser(db, user.id) });
  });

  router.post("/me/password", signedIn, ...passwordChangeLimits, async (req, res) => {
    const user = signedInUser(req);
    const input = parseWith(changePasswordSchema, req.body, "The password form");
    const account = findUserForSignIn(db, user.email);
    if (!account || !(await verifyPassword(input.currentPassword, account.passwordHash))) {
      countAsGuess(res);
      throw new AppError("invalid", 422, "The current password is not right.", [{ path: "currentPassword", message: "Not your current password" }]);
    }
    await setPassword(db, user.id, input.newPassword);
    res.json(await endSessionsAfterPasswordChange(req, res, user.id));
  });

  return router;
}

declare module "express-session" {
  interface SessionData {
    csrfIssued?: boolean;
  }
}
