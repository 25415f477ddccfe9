// value, onChange and error for a form control bound to one text key of a form's state, so a
// form writes `{...field('soil')}` instead of the same three props for every control.
import type { ChangeEvent } from 'react';

type TextKeys<T> = { [K in keyof T]: T[K] extends string ? K : never }[keyof T] & string;
type FieldControl = HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement;

export function fieldBinder<T>(
  values: T,
  set: (patch: Partial<T>) => void,
  errors: Partial<Record<string, string>>,
) {
  return (key: TextKeys<T>) => ({
    value: values[key] as string,
    onChange: (e: ChangeEvent<FieldControl>) => set({ [key]: e.target.value } as Partial<T>),
    error: errors[key],
  });
}
