// Zod schemas for what a form's boxes hold (text) that read numbers with the shared parser and
// validate them with the API's own schema for the field, so a form and its route agree.
import { z } from 'zod';
import { parseDecimal } from '../../../shared/units/parse-decimal';

export const FILL_IN_MESSAGE = 'Fill this in';

/** How a box's number relates to the stored one, when the form shows another unit. */
export interface DisplayUnit {
  /** The unit the person types in, used in range messages ("At most 101.6 cm"). */
  unit: string;
  toStored: (shown: number) => number;
  fromStored: (stored: number) => number;
}

const bound = new Intl.NumberFormat('en', { maximumFractionDigits: 2 });

function messageFor(issue: z.core.$ZodIssue, stored: unknown, display?: DisplayUnit): string {
  if (issue.code === 'invalid_type' && stored === undefined) return FILL_IN_MESSAGE;
  if (display && issue.code === 'too_big' && typeof issue.maximum === 'number')
    return `At most ${bound.format(display.fromStored(issue.maximum))} ${display.unit}`;
  if (display && issue.code === 'too_small' && typeof issue.minimum === 'number')
    return issue.minimum === 0 && !issue.inclusive
      ? 'Must be above 0'
      : `At least ${bound.format(display.fromStored(issue.minimum))} ${display.unit}`;
  return issue.message;
}

/** Runs the API's schema on a value and copies its issues (reworded for the box) onto ctx. */
function checkWith<S extends z.ZodType>(
  schema: S,
  value: unknown,
  ctx: z.RefinementCtx,
  display?: DisplayUnit,
): z.output<S> {
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  for (const issue of result.error.issues)
    ctx.addIssue({ code: 'custom', message: messageFor(issue, value, display), path: issue.path });
  return z.NEVER;
}

/**
 * A number box: its text read by `parseDecimal` ("12,5" is 12.5; letters say "Enter a number"),
 * converted to the stored unit when `display` is given, then checked by `apiSchema`. An empty box
 * is `undefined`, which an optional API field accepts and a required one answers "Fill this in".
 */
export function numberText<S extends z.ZodType>(apiSchema: S, display?: DisplayUnit) {
  return z.string().transform((text, ctx): z.output<S> => {
    const read = parseDecimal(text);
    if (!read.ok) {
      ctx.addIssue({ code: 'custom', message: read.message });
      return z.NEVER;
    }
    const stored =
      read.value === null ? undefined : display ? display.toStored(read.value) : read.value;
    return checkWith(apiSchema, stored, ctx, display);
  });
}

/** A select whose first option is empty ("Choose…"): empty says `emptyMessage`. */
export function choiceText<S extends z.ZodType>(apiSchema: S, emptyMessage: string) {
  return z.string().transform((value, ctx): z.output<S> => {
    if (value === '') {
      ctx.addIssue({ code: 'custom', message: emptyMessage });
      return z.NEVER;
    }
    return checkWith(apiSchema, value, ctx);
  });
}
