import { z } from "zod";

/** GET /api/data-version: a token for the database state, which changes with every write of figures. */
export const dataVersionAnswerSchema = z.object({ version: z.string() });
export type DataVersionAnswer = z.infer<typeof dataVersionAnswerSchema>;
