import { Router, type Request, type Response } from "express";
import rateLimit from "express-rate-limit";
import type passport from "passport";
import { changePasswordSchema, preferencesSchema, signInSchema, type CurrentUser } from "../../shared/schemas/auth";
import type { Db } from "../db/client";
import { AppError } from "../errors";
import { parseWith } from "../http/validate";
import { findActiveUser, findUserForSignIn, setLengthUnit, setPassword } from "../users/service";
import { signedIn, signedInUser } from "./guard";
import { verifyPassword } from "./passwords";

interface Deps {
  db: Db;
  passport: passport.Authenticator;
  csrfToken: (req: Request, res: Response) => string;
  signInLimit: { windowMs: number; limit: number };
}

function signIn(req: Request, user: CurrentUser): Promise<void> {
  // passport 0.7 regenerates the session id on login, which defeats session fixation
  return new Promise((resolve, reject) => req.logIn(user, (err) => (err ? reject(err) : resolve())));
}

export function authRoutes({ db, passport, csrfToken, signInLimit }: Deps): Router {
  const router = Router();

  const limiter = rateLimit({
    windowMs: signInLimit.windowMs,
    limit: signInLimit.limit,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    // only failed attempts count, so a busy training room behind one address can still sign in
    skipSuccessfulRequests: true,
    handler: (_req, res) => {
      res.status(429).json({
        error: { code: "rate_limited", message: "Too many sign-in attempts from here. Wait a few minutes, then try again." },
      });
    },
  });

  router.get("/auth/csrf", (req, res) => {
    // mark the session so it is saved and the token's session id stays the same until sign-in
    req.session.csrfIssued = true;
    res.json({ csrfToken: csrfToken(req, res) });
  });

  router.post("/auth/login", limiter, async (req, res) => {
    const credentials = parseWith(signInSchema, req.body, "The sign-in form");
    const user = await new Promise<CurrentUser | false>((resolve, reject) => {
      req.body = credentials;
      passport.authenticate("local", (err: unknown, found: CurrentUser | false) => (err ? reject(err) : resolve(found)))(req, res, () => {});
    });
    if (!user) throw new AppError("invalid_credentials", 401, "The e-mail or password is not right.");
    await signIn(req, user);
    res.json({ user, csrfToken: csrfToken(req, res) });
  });

  router.post("/auth/logout", (req, res, next) => {
    req.logOut((err) => {
      if (err) return next(err);
      req.session.destroy(() => {
        res.clearCookie("qb.sid");
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

  router.post("/me/password", signedIn, limiter, async (req, res) => {
    const user = signedInUser(req);
    const input = parseWith(changePasswordSchema, req.body, "The password form");
    const account = findUserForSignIn(db, user.email);
    if (!account || !(await verifyPassword(input.currentPassword, account.passwordHash))) {
      throw new AppError("invalid", 422, "The current password is not right.", [
        { path: "currentPassword", message: "Not your current password" },
      ]);
    }
    await setPassword(db, user.id, input.newPassword);
    res.status(204).end();
  });

  return router;
}

declare module "express-session" {
  interface SessionData {
    csrfIssued?: boolean;
  }
}
