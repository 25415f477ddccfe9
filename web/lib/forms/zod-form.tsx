// Forms through react-hook-form with the zod resolver: one hook, one <Form> wrapper, and the
// server's field messages put on the same fields, with focus on the first field that is wrong.
import { zodResolver } from '@hookform/resolvers/zod';
import type { ComponentPropsWithoutRef, ReactNode } from 'react';
import {
  FormProvider,
  useForm,
  type FieldValues,
  type Path,
  type Resolver,
  type SubmitHandler,
  type UseFormProps,
  type UseFormReturn,
} from 'react-hook-form';
import type { z } from 'zod';
import { isApiError } from '../api-client';

type FormSchema = z.ZodType<FieldValues, FieldValues>;

/**
 * `useForm` validated by `schema` (its input is what the boxes hold, its output what the API
 * takes). Errors show after the first submit and then follow each change; a failed submit moves
 * focus to the first field in error.
 */
export function useZodForm<S extends FormSchema>(
  schema: S,
  props: Omit<UseFormProps<z.input<S>, unknown, z.output<S>>, 'resolver'> = {},
): UseFormReturn<z.input<S>, unknown, z.output<S>> {
  return useForm<z.input<S>, unknown, z.output<S>>({
    resolver: zodResolver(schema) as unknown as Resolver<z.input<S>, unknown, z.output<S>>,
    mode: 'onSubmit',
    reValidateMode: 'onChange',
    shouldFocusError: true,
    ...props,
  });
}

/**
 * Puts the field messages of a `validation_failed` answer on the form's fields (focusing the
 * first); returns true when there were any.
 */
export function applyServerErrors<T extends FieldValues>(
  form: UseFormReturn<T, unknown, FieldValues>,
  error: unknown,
  rename: Record<string, string> = {},
): boolean {
  if (!isApiError(error)) return false;
  const entries = Object.entries(error.fields);
  entries.forEach(([field, message], index) => {
    form.setError(
      (rename[field] ?? field) as Path<T>,
      { type: 'server', message },
      { shouldFocus: index === 0 },
    );
  });
  return entries.length > 0;
}

type FormElementProps = Omit<ComponentPropsWithoutRef<'form'>, 'onSubmit' | 'children'>;

/** A <form> whose fields read the form from context (FormTextField and friends). */
export function Form<TIn extends FieldValues, TOut extends FieldValues>({
  form,
  onSubmit,
  children,
  ...rest
}: FormElementProps & {
  form: UseFormReturn<TIn, unknown, TOut>;
  onSubmit: SubmitHandler<TOut>;
  children: ReactNode;
}) {
  return (
    <FormProvider {...form}>
      <form noValidate onSubmit={form.handleSubmit(onSubmit)} {...rest}>
        {children}
      </form>
    </FormProvider>
  );
}
