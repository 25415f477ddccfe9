// Select and multi-line fields styled like the shared TextField, with hint and error text wired up.
import {
  useId,
  type ReactNode,
  type Ref,
  type SelectHTMLAttributes,
  type TextareaHTMLAttributes,
} from 'react';
import { cn } from '../../lib/cn';
import { FieldError, fieldErrorId } from './field-error';
import { controlClass } from './text-field';

interface FieldFrameProps {
  id: string;
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  disabled?: boolean;
  className?: string;
  children: ReactNode;
}

function FieldFrame({ id, label, hint, error, disabled, className, children }: FieldFrameProps) {
  return (
    <div className={cn('flex min-w-0 flex-col gap-1.5', className)}>
      <label htmlFor={id} className="text-label text-ink">
        {label}
        {disabled ? <span className="ml-1.5 text-caption text-ink-muted">(fixed)</span> : null}
      </label>
      {hint ? (
        <p id={`${id}-hint`} className="text-caption text-ink-muted">
          {hint}
        </p>
      ) : null}
      {children}
      <FieldError controlId={id} message={error} />
    </div>
  );
}

const describedBy = (id: string, hint: unknown, error: unknown) =>
  [hint ? `${id}-hint` : '', error ? fieldErrorId(id) : ''].filter(Boolean).join(' ') || undefined;

export interface SelectFieldProps extends Omit<SelectHTMLAttributes<HTMLSelectElement>, 'id'> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  containerClassName?: string;
  ref?: Ref<HTMLSelectElement>;
}

export function SelectField({
  label,
  hint,
  error,
  containerClassName,
  className,
  children,
  ...rest
}: SelectFieldProps) {
  const id = useId();
  return (
    <FieldFrame
      id={id}
      label={label}
      hint={hint}
      error={error}
      disabled={rest.disabled}
      className={containerClassName}
    >
      <select
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, hint, error)}
        className={cn(controlClass, error ? 'border-danger' : 'border-line-strong', className)}
        {...rest}
      >
        {children}
      </select>
    </FieldFrame>
  );
}

export interface TextAreaFieldProps extends Omit<
  TextareaHTMLAttributes<HTMLTextAreaElement>,
  'id'
> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  containerClassName?: string;
  ref?: Ref<HTMLTextAreaElement>;
}

export function TextAreaField({
  label,
  hint,
  error,
  containerClassName,
  className,
  ...rest
}: TextAreaFieldProps) {
  const id = useId();
  return (
    <FieldFrame
      id={id}
      label={label}
      hint={hint}
      error={error}
      disabled={rest.disabled}
      className={containerClassName}
    >
      <textarea
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, hint, error)}
        className={cn(
          controlClass,
          'py-2',
          error ? 'border-danger' : 'border-line-strong',
          className,
        )}
        rows={3}
        {...rest}
      />
    </FieldFrame>
  );
}
