import passport from "passport";
import { Strategy as LocalStrategy } from "passport-local";
import type { Db } from "../db/client";
import { findActiveUser, findUserForSignIn } from "../users/service";
import { UNUSABLE_HASH, verifyPassword } from "./passwords";

/** A passport instance of this app's own (not the global singleton), so tests can run several apps. */
export function createPassport(db: Db): passport.Authenticator {
  const instance = new passport.Passport();
  instance.use(
    new LocalStrategy({ usernameField: "email", passwordField: "password" }, (email, password, done) => {
      const account = findUserForSignIn(db, email);
      // verify against a dummy hash for unknown e-mails so both refusals take the same time
      verifyPassword(password, account?.passwordHash ?? UNUSABLE_HASH)
        .then((ok) => {
          if (!account || !ok || !account.active) return done(null, false);
          return done(null, findActiveUser(db, account.id) ?? false);
        })
        .catch(done);
    }),
  );
  instance.serializeUser((user, done) => done(null, user.id));
  instance.deserializeUser((id: number, done) => done(null, findActiveUser(db, id) ?? false));
  return instance;
}
