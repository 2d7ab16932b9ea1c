// Turns validation problems (from the shared zod schemas in the browser, or from the server's 422 details)
// into one message per form field.
import type { z } from "zod";

export type FieldErrors = Partial<Record<string, string>>;

/** First message per top-level field; problems without a field go under "form". */
export function fieldErrorsFromIssues(issues: readonly { path: readonly PropertyKey[]; message: string }[]): FieldErrors {
  const errors: FieldErrors = {};
  for (const issue of issues) {
    const key = issue.path.length > 0 ? String(issue.path[0]) : "form";
    errors[key] ??= issue.message;
  }
  return errors;
}

export function fieldErrorsFromZod(error: z.ZodError): FieldErrors {
  return fieldErrorsFromIssues(error.issues);
}

/**
 * Reads field messages from a server error's details: the server's [{ path: "field", message }] list, zod
 * issue lists, zod's flattened { fieldErrors } and a plain { field: message } record; anything else yields
 * nothing.
 */
export function fieldErrorsFromDetails(details: unknown): FieldErrors {
  if (!details || typeof details !== "object") return {};
  if (Array.isArray(details)) {
    // The server sends { path: "instructorId", message } (nested paths joined with "."); zod sends arrays.
    const issues = details
      .filter((item) => !!item && typeof item.message === "string" && (Array.isArray(item.path) || typeof item.path === "string"))
      .map((item: { path: PropertyKey[] | string; message: string }) => ({
        path: typeof item.path === "string" ? item.path.split(".").filter(Boolean) : item.path,
        message: item.message,
      }));
    return fieldErrorsFromIssues(issues);
  }
  const record = details as Record<string, unknown>;
  if (Array.isArray(record.issues)) return fieldErrorsFromDetails(record.issues);
  if (record.fieldErrors && typeof record.fieldErrors === "object") return fieldErrorsFromDetails(record.fieldErrors);
  const errors: FieldErrors = {};
  for (const [key, value] of Object.entries(record)) {
    if (typeof value === "string") errors[key] = value;
    else if (Array.isArray(value) && typeof value[0] === "string") errors[key] = value[0];
  }
  return errors;
}
