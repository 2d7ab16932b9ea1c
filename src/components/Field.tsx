// Labelled form controls. Each control is tied to its label, its hint and its error message, so screen
// readers announce all three and the error sits right beside the field it is about.
import clsx from "clsx";
import { useId, type InputHTMLAttributes, type ReactNode, type Ref, type SelectHTMLAttributes } from "react";

export interface FieldIds {
  id: string;
  describedBy: string | undefined;
  invalid: boolean;
}

export interface FieldProps {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  /** Marks the label "optional"; required is the default in Quarterbeat's forms. */
  optional?: boolean;
  className?: string;
  children: (ids: FieldIds) => ReactNode;
}

/** Label + control + hint + error for any control (render prop receives the ids to wire up). */
export function Field({ label, hint, error, optional, className, children }: FieldProps) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [errorId, hintId].filter(Boolean).join(" ") || undefined;
  return (
    <div className={clsx("flex flex-col gap-1", className)}>
      <label htmlFor={id} className="text-small font-semibold text-ink">
        {label}
        {optional && <span className="font-normal text-muted"> (optional)</span>}
      </label>
      {hint && (
        <p id={hintId} className="text-caption text-muted">
          {hint}
        </p>
      )}
      {children({ id, describedBy, invalid: Boolean(error) })}
      {error && (
        <p id={errorId} className="flex items-start gap-1 text-small font-medium text-danger-text">
          <ErrorMark />
          <span>{error}</span>
        </p>
      )}
    </div>
  );
}

function ErrorMark() {
  return (
    <svg viewBox="0 0 16 16" className="mt-[3px] size-4 shrink-0" aria-hidden="true">
      <path d="M8 1.5 15 14H1z" fill="currentColor" />
      <path d="M8 6v3.5M8 11.5v.5" stroke="white" strokeWidth="1.6" strokeLinecap="round" />
    </svg>
  );
}

export const controlClass = (invalid: boolean) =>
  clsx(
    "min-h-11 w-full rounded-control border bg-surface px-3 text-body text-ink placeholder:text-muted",
    "disabled:bg-paper disabled:text-muted",
    invalid ? "border-danger-text border-2" : "border-line-strong",
  );

type InputOwnProps = Omit<FieldProps, "children">;

export interface InputProps extends InputOwnProps, Omit<InputHTMLAttributes<HTMLInputElement>, "className"> {
  inputClassName?: string;
  ref?: Ref<HTMLInputElement>;
}

export function Input({ label, hint, error, optional, className, inputClassName, ...input }: InputProps) {
  return (
    <Field label={label} hint={hint} error={error} optional={optional} className={className}>
      {({ id, describedBy, invalid }) => (
        <input id={id} aria-describedby={describedBy} aria-invalid={invalid || undefined} className={clsx(controlClass(invalid), inputClassName)} {...input} />
      )}
    </Field>
  );
}

export interface SelectOption {
  value: string;
  label: string;
  disabled?: boolean;
}

export interface SelectProps extends InputOwnProps, Omit<SelectHTMLAttributes<HTMLSelectElement>, "className"> {
  options: readonly SelectOption[];
  /** A first, empty choice such as "Choose a role…". */
  placeholder?: string;
  ref?: Ref<HTMLSelectElement>;
}

export function Select({ label, hint, error, optional, className, options, placeholder, ...select }: SelectProps) {
  return (
    <Field label={label} hint={hint} error={error} optional={optional} className={className}>
      {({ id, describedBy, invalid }) => (
        <select id={id} aria-describedby={describedBy} aria-invalid={invalid || undefined} className={clsx(controlClass(invalid), "pr-8")} {...select}>
          {placeholder !== undefined && <option value="">{placeholder}</option>}
          {options.map((option) => (
            <option key={option.value} value={option.value} disabled={option.disabled}>
              {option.label}
            </option>
          ))}
        </select>
      )}
    </Field>
  );
}
