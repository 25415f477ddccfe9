// One reading of a typed or imported number, used by every form, the grid, CSV import and the CLI.

/** What a typed number reads as: a value (null when the box is empty) or why it cannot be read. */
export type ParsedDecimal = { ok: true; value: number | null } | { ok: false; message: string };

export const THOUSANDS_MESSAGE = 'Write 1234 or 1234.5, without thousands separators';
export const NOT_A_NUMBER_MESSAGE = 'Enter a number';

// A sign, digits, and at most one decimal separator (point or comma) with digits after it.
const DECIMAL = /^[-+]?(\d+([.,]\d+)?|[.,]\d+)$/;
// "1,234" or "12,500": a comma after 1–3 digits (not a lone 0) and exactly three more reads
// as a thousands separator in the US and as a decimal comma elsewhere, so it is refused.
const AMBIGUOUS_COMMA = /^[-+]?[1-9]\d{0,2},\d{3}$/;
// Spaces, apostrophes or repeated separators between digit groups: "1 234", "1'234", "1.234.567".
const GROUPED = /^[-+]?\d{1,3}([.,' \u00a0\u202f]\d{3}){1,}([.,]\d+)?$/;

/**
 * Reads a number as growers type it: "12.5" and "12,5" are both 12.5 (a decimal comma is
 * common outside the US). A value with both separators, or grouped like "1,234", is refused
 * rather than guessed, because "1,234" means 1.234 in one country and 1234 in another.
 *
 * @param text what was typed or found in a CSV cell
 * @returns `{ ok: true, value }` (value null for an empty box) or `{ ok: false, message }`
 * @example parseDecimal('12,5') // { ok: true, value: 12.5 }
 */
export function parseDecimal(text: string): ParsedDecimal {
  const trimmed = text.trim();
  if (trimmed === '') return { ok: true, value: null };
  if (trimmed.includes('.') && trimmed.includes(','))
    return { ok: false, message: THOUSANDS_MESSAGE };
  if (AMBIGUOUS_COMMA.test(trimmed)) return { ok: false, message: THOUSANDS_MESSAGE };
  if (DECIMAL.test(trimmed)) {
    const value = Number(trimmed.replace(',', '.'));
    if (Number.isFinite(value)) return { ok: true, value };
  }
  if (GROUPED.test(trimmed)) return { ok: false, message: THOUSANDS_MESSAGE };
  return { ok: false, message: NOT_A_NUMBER_MESSAGE };
}
