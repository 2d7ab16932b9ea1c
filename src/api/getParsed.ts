// Every answer the client reads is checked against the zod schema the server builds it from (shared/schemas),
// so a page never draws numbers the server did not promise.
import type { z } from "zod";
import { ApiError, http } from "./http";

export const unexpectedAnswerMessage =
  "The server's answer was not in the expected form, so its figures are not shown. Reload the page; if it stays, tell your coordinator.";

/** Parses an answer; a shape the schema refuses becomes a readable error rather than wrong numbers. */
export async function getParsed<S extends z.ZodType>(schema: S, path: string, signal?: AbortSignal): Promise<z.infer<S>> {
  const parsed = schema.safeParse(await http.get<unknown>(path, signal));
  if (parsed.success) return parsed.data;
  // Status 200 keeps the query client from retrying: asking again brings the same answer.
  throw new ApiError(200, "unexpected_answer", unexpectedAnswerMessage, parsed.error.issues);
}
