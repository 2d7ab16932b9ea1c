import { z } from "zod";

/** Site, instructor and manikin codes as they appear in import files. */
export const codeSchema = z
  .string()
  .trim()
  .regex(/^[A-Za-z0-9._-]{1,32}$/, "Use 1–32 letters, digits, '.', '_' or '-'");

export const newSiteSchema = z.object({
  code: codeSchema,
  name: z.string().trim().min(1, "Enter the site's name").max(120, "Use at most 120 characters"),
});
export type NewSite = z.infer<typeof newSiteSchema>;

export const updateSiteSchema = z
  .object({
    name: z.string().trim().min(1, "Enter the site's name").max(120),
    active: z.boolean(),
  })
  .partial();

export const siteRowSchema = z.object({
  id: z.number(),
  code: z.string(),
  name: z.string(),
  active: z.boolean(),
  instructors: z.number(),
  manikins: z.number(),
});
export type SiteRow = z.infer<typeof siteRowSchema>;
/** GET /api/sites. */
export const siteListAnswerSchema = z.object({ sites: z.array(siteRowSchema) });

export const newInstructorSchema = z.object({
  code: codeSchema,
  name: z.string().trim().min(1, "Enter the instructor's name").max(120),
  siteId: z.number().int().positive().nullable(),
});

export const updateInstructorSchema = z
  .object({
    name: z.string().trim().min(1).max(120),
    siteId: z.number().int().positive().nullable(),
    active: z.boolean(),
  })
  .partial();

export const instructorRowSchema = z.object({
  id: z.number(),
  code: z.string(),
  name: z.string(),
  siteId: z.number().nullable(),
  siteCode: z.string().nullable(),
  active: z.boolean(),
});
export type InstructorRow = z.infer<typeof instructorRowSchema>;
/** GET /api/instructors. */
export const instructorListAnswerSchema = z.object({ instructors: z.array(instructorRowSchema) });
