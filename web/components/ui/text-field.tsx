// A labelled text input with hint and error text wired up for screen readers and phone keyboards.
import { forwardRef, useId, type InputHTMLAttributes, type ReactNode } from 'react';
import { cn } from '../../lib/cn';
import { FieldError, fieldErrorId } from './field-error';

export interface TextFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'id'> {
  label: ReactNode;
  /** Shown under the label; say what the value is for or what unit it takes. */
  hint?: ReactNode;
  error?: string;
  /** A unit shown inside the field's right edge (e.g. "lb/acre"). */
  suffix?: ReactNode;
  id?: string;
  containerClassName?: string;
}

/** Looks of every text-like control; a disabled one is sunken, dashed and muted. */
export const controlClass = cn(
  'block min-h-11 w-full min-w-0 rounded-field border bg-surface px-3 text-body text-ink',
  'placeholder:text-ink-muted/70 focus:border-accent focus:outline-none focus:ring-2 focus:ring-accent/30',
  'disabled:cursor-not-allowed disabled:border-dashed disabled:bg-disabled-bg disabled:text-disabled-ink',
);

export const TextField = forwardRef<HTMLInputElement, TextFieldProps>(function TextField(
  { label, hint, error, suffix, id, className, containerClassName, required, ...rest },
  ref,
) {
  const autoId = useId();
  const inputId = id ?? autoId;
  const hintId = hint ? `${inputId}-hint` : undefined;
  const errorId = error ? fieldErrorId(inputId) : undefined;
  return (
    <div className={cn('flex min-w-0 flex-col gap-1.5', containerClassName)}>
      <label htmlFor={inputId} className="text-label text-ink">
        {label}
        {required ? (
          <span aria-hidden="true" className="ml-0.5 text-danger">
            *
          </span>
        ) : null}
        {rest.disabled ? <span className="ml-1.5 text-caption text-ink-muted">(fixed)</span> : null}
      </label>
      {hint ? (
        <p id={hintId} className="text-caption text-ink-muted">
          {hint}
        </p>
      ) : null}
      <div className="relative">
        <input
          ref={ref}
          id={inputId}
          required={required}
          aria-invalid={error ? true : undefined}
          aria-describedby={[hintId, errorId].filter(Boolean).join(' ') || undefined}
          className={cn(
            controlClass,
            error ? 'border-danger' : 'border-line-strong',
            suffix ? 'pr-16' : undefined,
            className,
          )}
          {...rest}
        />
        {suffix ? (
          <span className="pointer-events-none absolute inset-y-0 right-3 flex items-center text-caption text-ink-muted">
            {suffix}
          </span>
        ) : null}
      </div>
      <FieldError controlId={inputId} message={error} />
    </div>
  );
});
