import { Router } from "express";
import { newUserSchema, resetPasswordSchema, updateUserSchema } from "../../shared/schemas/users";
import type { Db } from "../db/client";
import { allow, signedInUser } from "../auth/guard";
import { AppError } from "../errors";
import { parseId, parseWith } from "../http/validate";
import { createUser, listUsers, setPassword, updateUser } from "./service";

export function userRoutes(db: Db): Router {
  const router = Router();
  router.use("/users", allow("manageUsers"));

  router.get("/users", (_req, res) => {
    res.json({ users: listUsers(db) });
  });

  router.post("/users", async (req, res) => {
    const input = parseWith(newUserSchema, req.body, "The new user");
    res.status(201).json({ user: await createUser(db, input) });
  });

  router.patch("/users/:id", (req, res) => {
    const id = parseId(req.params.id);
    const changes = parseWith(updateUserSchema, req.body, "The change");
    if (id === signedInUser(req).id && (changes.active === false || (changes.role && changes.role !== "coordinator"))) {
      throw new AppError("conflict", 409, "You cannot deactivate yourself or remove your own coordinator role.");
    }
    res.json({ user: updateUser(db, id, changes) });
  });

  router.post("/users/:id/password", async (req, res) => {
    const id = parseId(req.params.id);
    const { password } = parseWith(resetPasswordSchema, req.body, "The password");
    await setPassword(db, id, password);
    res.status(204).end();
  });

  return router;
}
