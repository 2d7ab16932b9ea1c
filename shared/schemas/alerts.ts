// The alerts after each import: a user's choice of kinds (GET and PUT /api/me/alerts) and the history of the
// signals mailed (GET /api/alerts, GET /api/alerts/all).
import { z } from "zod";
import { alertKinds } from "../alertKinds";

export const alertKindSchema = z.enum(alertKinds, { message: `Choose from ${alertKinds.join(", ")}` });

export const alertChoiceSchema = z.object({
  kinds: z
    .array(alertKindSchema)
    .max(alertKinds.length)
    .refine((kinds) => new Set(kinds).size === kinds.length, "Name each kind once"),
});
export type AlertChoice = z.infer<typeof alertChoiceSchema>;

export const alertChoiceAnswerSchema = z.object({
  kinds: z.array(alertKindSchema),
  /** True while the user has not chosen: the role's defaults apply. */
  isDefault: z.boolean(),
});
export type AlertChoiceAnswer = z.infer<typeof alertChoiceAnswerSchema>;

/** Where the page behind a signal is, when the reader may open it. */
export const alertLinkSchema = z.object({ label: z.string(), path: z.string() });

export const alertDeliverySchema = z.object({
  key: z.string(),
  kind: alertKindSchema,
  summary: z.string(),
  sentAt: z.string(),
  link: alertLinkSchema.nullable(),
});
export type AlertDelivery = z.infer<typeof alertDeliverySchema>;

export const myAlertsAnswerSchema = z.object({ deliveries: z.array(alertDeliverySchema) });
export type MyAlertsAnswer = z.infer<typeof myAlertsAnswerSchema>;

/** Every user's alerts, each signal once: when it first went out and to how many people. */
export const allAlertsAnswerSchema = z.object({
  signals: z.array(alertDeliverySchema.extend({ recipients: z.number().int().nonnegative() })),
});
export type AllAlertsAnswer = z.infer<typeof allAlertsAnswerSchema>;
