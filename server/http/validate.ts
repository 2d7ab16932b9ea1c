import type { ZodType } from "zod";
import { validationError } from "../errors";

/** Parses a request part with a shared zod schema, answering 422 with the field messages when it fails. */
export function parseWith<T>(schema: ZodType<T>, value: unknown, what?: string): T {
  const result = schema.safeParse(value);
  if (!result.success) throw validationError(result.error, what);
  return result.data;
}

export function parseId(value: unknown): number {
  const id = Number(value);
  if (!Number.isInteger(id) || id <= 0) throw validationError({ issues: [{ path: ["id"], message: "Expected a positive whole number" }] } as never, "The id");
  return id;
}
