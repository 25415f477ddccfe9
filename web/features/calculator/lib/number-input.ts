// Reading the calculators' typed numbers and turning a failed zod parse into per-field messages.
import type { z } from 'zod';

/** The number typed in a field: undefined when empty, NaN when it is not a number. */
export function parseNumberInput(value: string): number | undefined {
  const t = value.trim();
  if (t === '') return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : Number.NaN;
}

/** The first message for each field; a missing or non-numeric value gets plain wording. */
export function numberFieldErrors(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = String(issue.path[0] ?? 'form');
    fields[key] ??=
      issue.code === 'invalid_type'
        ? issue.input === undefined
          ? 'Fill this in'
          : 'Enter a number'
        : issue.message;
  }
  return fields;
}
