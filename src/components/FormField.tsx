// One field of a schema form (src/lib/useSchemaForm.ts): a labelled text box, or a select when given
// options, that reads and writes the form value of its name and shows that value's message.
import { useController, useFormContext } from "react-hook-form";
import { Input, Select, type InputProps, type SelectProps } from "./Field";

type Wired = "name" | "value" | "defaultValue" | "onChange" | "onBlur" | "error" | "ref";

interface TextFieldProps extends Omit<InputProps, Wired> {
  name: string;
}

interface ChoiceFieldProps extends Omit<SelectProps, Wired> {
  name: string;
  /** The value is a record id: the empty choice is null, any other a number. */
  numeric?: boolean;
  /** Called after the choice changed, e.g. to clear a field that only the old choice needed. */
  onChosen?: (value: unknown) => void;
}

export function FormField(props: TextFieldProps | ChoiceFieldProps) {
  const { control } = useFormContext();
  const {
    field: { ref, value, onChange, onBlur },
    fieldState,
  } = useController({ name: props.name, control });
  const error = fieldState.error?.message;

  if ("options" in props) {
    const { numeric, onChosen, ...select } = props;
    return (
      <Select
        {...select}
        ref={ref}
        value={value === null || value === undefined ? "" : String(value)}
        onBlur={onBlur}
        onChange={(event) => {
          const raw = event.target.value;
          const chosen = numeric ? (raw === "" ? null : Number(raw)) : raw;
          onChange(chosen);
          onChosen?.(chosen);
        }}
        error={error}
      />
    );
  }
  return <Input {...props} ref={ref} value={value ?? ""} onBlur={onBlur} onChange={(event) => onChange(event.target.value)} error={error} />;
}
