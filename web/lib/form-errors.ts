// Turns zod issues and API errors into per-field messages and one summary line for forms.
import { z } from 'zod';
import { isApiError, UnexpectedResponseError } from './api-client';

export type FieldErrors = Record<string, string>;

/** The first message for each top-level field of a failed zod parse. */
export function zodFieldErrors(error: z.ZodError): FieldErrors {
  const fields: FieldErrors = {};
  for (const issue of error.issues) {
    const key = String(issue.path[0] ?? 'form');
    fields[key] ??= issue.message;
  }
  return fields;
}

/** Field messages the API sent with a `validation_failed` answer. */
export function apiFieldErrors(error: unknown): FieldErrors {
  return isApiError(error) ? error.fields : {};
}

/** One sentence for the top of a form; specific wording for the common cases. */
export function errorSummary(error: unknown): string {
  if (!error) return '';
  if (isApiError(error)) {
    if (error.code === 'network_error') return error.message;
    if (error.status === 429)
      return 'Too many attempts in a short time. Wait a few minutes, then try again.';
    if (error.code === 'validation_failed') return 'Some fields need another look.';
    if (error.status >= 500) return 'Something went wrong on the server. Try again in a moment.';
    return error.message;
  }
  if (error instanceof z.ZodError || error instanceof UnexpectedResponseError) {
    return 'The server sent an answer this page does not understand. Reload the page; if it happens again, tell your coordinator.';
  }
  return error instanceof Error ? error.message : 'Something went wrong.';
}
