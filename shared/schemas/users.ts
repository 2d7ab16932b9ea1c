import { z } from "zod";
import { userRoles } from "../domain";
import { emailSchema, newPasswordSchema } from "./auth";

export const displayNameSchema = z.string().trim().min(1, "Enter a name").max(120, "Use at most 120 characters");

export const newUserSchema = z
  .object({
    email: emailSchema,
    displayName: displayNameSchema,
    role: z.enum(userRoles, { message: "Choose a role" }),
    instructorId: z.number().int().positive().nullable().default(null),
    password: newPasswordSchema,
  })
  .refine((u) => u.role !== "instructor" || u.instructorId !== null, {
    message: "An instructor account must be linked to an instructor",
    path: ["instructorId"],
  });
export type NewUser = z.infer<typeof newUserSchema>;

export const updateUserSchema = z
  .object({
    displayName: displayNameSchema,
    role: z.enum(userRoles),
    instructorId: z.number().int().positive().nullable(),
    active: z.boolean(),
  })
  .partial();
export type UpdateUser = z.infer<typeof updateUserSchema>;

export const resetPasswordSchema = z.object({ password: newPasswordSchema });

export const userRowSchema = z.object({
  id: z.number(),
  email: z.string(),
  displayName: z.string(),
  role: z.enum(userRoles),
  instructorId: z.number().nullable(),
  instructorCode: z.string().nullable(),
  active: z.boolean(),
  createdAt: z.string(),
});
export type UserRow = z.infer<typeof userRowSchema>;
/** GET /api/users. */
export const userListAnswerSchema = z.object({ users: z.array(userRowSchema) });
