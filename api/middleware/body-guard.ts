// Refuses request text PostgreSQL cannot store or date columns cannot hold, naming the field:
// NUL characters, lone UTF-16 surrogates (from JSON escapes) and the year 0000.
import type { RequestHandler } from 'express';
import { ValidationError } from '../errors';

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;
// PostgreSQL has no year 0 and ISO dates in Sheaf are years 0001–9999.
const YEAR_ZERO_DATE = /^0000-\d\d-\d\d/;

/** Why a text cannot be stored, or null when it can. */
export function unsafeTextReason(text: string): string | null {
  if (text.includes('\u0000')) return 'Remove the NUL character (\\u0000) from this text';
  if (LONE_SURROGATE.test(text)) return 'This text holds a broken character (a lone surrogate)';
  if (YEAR_ZERO_DATE.test(text)) return 'There is no year 0000; use a date like 2027-04-15';
  return null;
}

/** The first unstorable string in a parsed body, as [dotted field path, reason]. */
export function findUnsafeText(value: unknown, path: string[] = []): [string, string] | null {
  if (typeof value === 'string') {
    const reason = unsafeTextReason(value);
    return reason ? [path.length ? path.join('.') : '_', reason] : null;
  }
  if (value === null || typeof value !== 'object') return null;
  for (const [key, item] of Object.entries(value as Record<string, unknown>)) {
    const keyReason = unsafeTextReason(key);
    if (keyReason) return [[...path, '_'].join('.'), keyReason];
    const found = findUnsafeText(item, [...path, key]);
    if (found) return found;
  }
  return null;
}

/** Runs after the JSON parser (and after multer for multipart fields). */
export const rejectUnsafeText: RequestHandler = (req, _res, next) => {
  const found = findUnsafeText(req.body);
  if (!found) return next();
  const [field, reason] = found;
  next(new ValidationError(`Check ${field}: ${reason}`, { [field]: reason }));
};
