import { z } from "zod";
import { lengthUnits, userRoles } from "../domain";

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email({ message: "Enter an e-mail address such as name@example.org" }));

export const newPasswordSchema = z.string().min(10, "Use at least 10 characters").max(200, "Use at most 200 characters");

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, "Enter your password").max(200),
});
export type SignIn = z.infer<typeof signInSchema>;

export const changePasswordSchema = z
  .object({
    currentPassword: z.string().min(1, "Enter your current password"),
    newPassword: newPasswordSchema,
    confirmPassword: z.string(),
  })
  .refine((v) => v.newPassword === v.confirmPassword, {
    message: "The two new passwords differ",
    path: ["confirmPassword"],
  });
export type ChangePassword = z.infer<typeof changePasswordSchema>;

export const preferencesSchema = z.object({ lengthUnit: z.enum(lengthUnits) });

/** What GET /api/me and POST /api/auth/login answer. */
export const currentUserSchema = z.object({
  id: z.number(),
  email: z.string(),
  displayName: z.string(),
  role: z.enum(userRoles),
  instructorId: z.number().nullable(),
  siteId: z.number().nullable(),
  lengthUnit: z.enum(lengthUnits),
});
export type CurrentUser = z.infer<typeof currentUserSchema>;

export const sessionAnswerSchema = z.object({ user: currentUserSchema, csrfToken: z.string() });
export type SessionAnswer = z.infer<typeof sessionAnswerSchema>;
