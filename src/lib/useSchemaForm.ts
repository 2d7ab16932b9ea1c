// Forms validated by the shared zod schemas the server parses with (react-hook-form with its zod resolver),
// so the browser gives the server's own messages before anything is sent. Messages appear after the first
// submit and then follow each keystroke; a refused request puts its messages beside the fields too.
import { zodResolver } from "@hookform/resolvers/zod";
import { useForm, type DefaultValues, type FieldValues, type Path, type Resolver, type UseFormReturn } from "react-hook-form";
import type { z } from "zod";
import { ApiError } from "../api/http";
import { fieldProblems } from "../api/fieldProblems";

export type SchemaForm<Values extends FieldValues, Output> = UseFormReturn<Values, unknown, Output>;

/** Where a message for the whole form (a refused request without a field) is kept. */
export const FORM_ERROR = "root.server" as const;

/**
 * Values are what the form holds while it is filled in ("" for "not chosen yet"); the schema turns them into
 * the payload the server expects, or into the messages the server would give.
 */
export function useSchemaForm<Output, Values extends FieldValues>(schema: z.ZodType<Output>, defaultValues: Values): SchemaForm<Values, Output> {
  return useForm<Values, unknown, Output>({
    // The schema's input type is the payload's; the form also holds the "" of an unchosen select.
    resolver: zodResolver(schema as z.ZodType<Output, Values>) as Resolver<Values, unknown, Output>,
    defaultValues: defaultValues as DefaultValues<Values>,
    mode: "onSubmit",
    reValidateMode: "onChange",
  });
}

/** Shows a failed request: field messages beside their fields, the rest at the top of the form. */
export function showServerError<Values extends FieldValues, Output>(form: SchemaForm<Values, Output>, error: unknown): void {
  if (!(error instanceof ApiError)) {
    form.setError(FORM_ERROR, { type: "server", message: "Something went wrong. Check the connection and try again." });
    return;
  }
  const { form: aboutForm, ...byField } = fieldProblems(error.details);
  for (const [name, message] of Object.entries(byField)) form.setError(name as Path<Values>, { type: "server", message });
  form.setError(FORM_ERROR, { type: "server", message: aboutForm ?? error.message });
}
