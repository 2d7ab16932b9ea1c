// A small form state hook driven by a shared zod schema: the same rules the server applies, checked in the
// browser first. Messages appear after the first submit and then follow each keystroke.
import { useCallback, useRef, useState, type FormEvent } from "react";
import type { z } from "zod";
import { ApiError } from "../api/http";
import { fieldErrorsFromDetails, fieldErrorsFromZod, type FieldErrors } from "./fieldErrors";

export interface ZodForm<Values, Output> {
  values: Values;
  errors: FieldErrors;
  /** A message for the whole form (server errors without a field). */
  formError: string | null;
  setValue: <K extends keyof Values>(name: K, value: Values[K]) => void;
  /** Changes several fields at once (e.g. a role and the instructor link that depends on it). */
  setValues: (changes: Partial<Values>) => void;
  handleSubmit: (onValid: (data: Output) => void | Promise<void>) => (event: FormEvent<HTMLFormElement>) => void;
  /** Shows a failed request: field messages beside their fields, the rest at the top of the form. */
  showServerError: (error: unknown) => void;
  reset: (values?: Values) => void;
}

/**
 * Values are what the form holds (strings while typing, "" for "not chosen yet"); the schema turns them into
 * the payload the server expects, with the same messages the server would give.
 */
export function useZodForm<Output, Values extends Record<string, unknown>>(
  schema: z.ZodType<Output>,
  initialValues: Values,
): ZodForm<Values, Output> {
  const [values, setValuesState] = useState<Values>(initialValues);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [submitted, setSubmitted] = useState(false);
  // The latest values, so two changes in one event build on each other instead of on the same render.
  const latest = useRef(values);

  const setValues = useCallback(
    (changes: Partial<Values>) => {
      const next = { ...latest.current, ...changes };
      latest.current = next;
      setValuesState(next);
      if (submitted) {
        const result = schema.safeParse(next);
        setErrors(result.success ? {} : fieldErrorsFromZod(result.error));
      }
    },
    [schema, submitted],
  );

  const setValue = useCallback(
    <K extends keyof Values>(name: K, value: Values[K]) => setValues({ [name]: value } as unknown as Partial<Values>),
    [setValues],
  );

  const handleSubmit = useCallback(
    (onValid: (data: Output) => void | Promise<void>) => (event: FormEvent<HTMLFormElement>) => {
      event.preventDefault();
      setSubmitted(true);
      setFormError(null);
      const result = schema.safeParse(values);
      if (!result.success) {
        const found = fieldErrorsFromZod(result.error);
        setErrors(found);
        focusFirstInvalid(event.currentTarget, Object.keys(found));
        return;
      }
      setErrors({});
      void onValid(result.data);
    },
    [schema, values],
  );

  const showServerError = useCallback((error: unknown) => {
    if (error instanceof ApiError) {
      const { form, ...byField } = fieldErrorsFromDetails(error.details);
      setErrors(byField);
      setFormError(form ?? error.message);
    } else {
      setFormError("Something went wrong. Check the connection and try again.");
    }
  }, []);

  const reset = useCallback(
    (next?: Values) => {
      latest.current = next ?? initialValues;
      setValuesState(latest.current);
      setErrors({});
      setFormError(null);
      setSubmitted(false);
    },
    [initialValues],
  );

  return { values, errors, formError, setValue, setValues, handleSubmit, showServerError, reset };
}

function focusFirstInvalid(form: HTMLFormElement, names: string[]): void {
  for (const element of Array.from(form.elements)) {
    const name = (element as HTMLInputElement).name;
    if (name && names.includes(name)) {
      (element as HTMLElement).focus();
      return;
    }
  }
}
