import { Router } from "express";
import { can } from "../../shared/permissions";
import { newUserSchema, resetPasswordSchema, updateUserSchema } from "../../shared/schemas/users";
import type { Db } from "../db/client";
import { allow, signedInUser } from "../auth/guard";
import type { EndSessionsAfterPasswordChange } from "../auth/passwordChangeSessions";
import { AppError } from "../errors";
import { parseId, parseWith } from "../http/validate";
import type { Mailer } from "../mail/mailer";
import { createUser, listUsers, setPassword, updateUser } from "./service";

export function userRoutes(db: Db, mailer: Mailer, endSessionsAfterPasswordChange: EndSessionsAfterPasswordChange): Router {
  const router = Router();
  router.use("/users", allow("manageUsers"));

  router.get("/users", (_req, res) => {
    res.json({ users: listUsers(db) });
  });

  router.post("/users", async (req, res) => {
    const input = parseWith(newUserSchema, req.body, "The new user");
    const user = await createUser(db, input);
    // The account exists either way; a failed welcome message is reported, not fatal.
    const signInUrl = `${req.protocol}://${req.get("host")}/sign-in`;
    const welcome = await mailer
      .sendWelcomeEmail(user, signInUrl)
      .then(() => ({ sent: true as const }))
      .catch((err: unknown) => ({ sent: false as const, error: err instanceof Error ? err.message : String(err) }));
    res.status(201).json({ user, welcome });
  });

  router.patch("/users/:id", (req, res) => {
    const id = parseId(req.params.id);
    const changes = parseWith(updateUserSchema, req.body, "The change");
    if (id === signedInUser(req).id && (changes.active === false || (changes.role && !can(changes.role, "manageUsers")))) {
      throw new AppError("conflict", 409, "You cannot deactivate yourself or remove your own coordinator role.");
    }
    res.json({ user: updateUser(db, id, changes) });
  });

  router.post("/users/:id/password", async (req, res) => {
    const id = parseId(req.params.id);
    const { password } = parseWith(resetPasswordSchema, req.body, "The password");
    await setPassword(db, id, password);
    // a reset of one's own account answers the rotated session, like a change on the account page
    const ownSession = await endSessionsAfterPasswordChange(req, res, id);
    if (ownSession) res.json(ownSession);
    else res.status(204).end();
  });

  return router;
}
