// Form controls bound by name to the surrounding react-hook-form (see web/lib/forms/zod-form):
// each registers itself and shows its own error, so a form lists fields, not wiring.
import { get, useFormContext, useFormState, type RegisterOptions } from 'react-hook-form';
import {
  SelectField,
  TextAreaField,
  type SelectFieldProps,
  type TextAreaFieldProps,
} from './form-fields';
import { TextField, type TextFieldProps } from './text-field';

/** The message for `name` (dotted paths such as "levels.0.multiplier" work). */
export function useFieldError(name: string): string | undefined {
  const { errors } = useFormState({ name });
  const error = get(errors, name) as { message?: string } | undefined;
  return error?.message;
}

type Named<P> = Omit<P, 'name' | 'error' | 'value' | 'defaultValue' | 'onChange' | 'onBlur'> & {
  name: string;
  /** Extra react-hook-form options, e.g. an onChange that fills in another field. */
  registerOptions?: Pick<RegisterOptions, 'onChange' | 'onBlur'>;
};

export function FormTextField({
  name,
  disabled,
  registerOptions,
  ...props
}: Named<TextFieldProps>) {
  const { register } = useFormContext();
  const error = useFieldError(name);
  return (
    <TextField {...props} {...register(name, registerOptions)} disabled={disabled} error={error} />
  );
}

/** A number box: decimal keyboard on phones, text kept as typed (the schema reads it). */
export function FormNumberField({
  whole = false,
  ...props
}: Named<TextFieldProps> & { whole?: boolean }) {
  return (
    <FormTextField
      inputMode={whole ? 'numeric' : 'decimal'}
      autoComplete="off"
      spellCheck={false}
      {...props}
    />
  );
}

export function FormSelectField({
  name,
  disabled,
  registerOptions,
  ...props
}: Named<SelectFieldProps>) {
  const { register } = useFormContext();
  const error = useFieldError(name);
  return (
    <SelectField
      {...props}
      {...register(name, registerOptions)}
      disabled={disabled}
      error={error}
    />
  );
}

export function FormTextAreaField({
  name,
  disabled,
  registerOptions,
  ...props
}: Named<TextAreaFieldProps>) {
  const { register } = useFormContext();
  const error = useFieldError(name);
  return (
    <TextAreaField
      {...props}
      {...register(name, registerOptions)}
      disabled={disabled}
      error={error}
    />
  );
}
