// One spelling per rate: "1", "1.0" and " 1.00 " are the same rate.

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * The key a rate is known by in the analysis. Rates written as numbers are equal when their
 * numbers are equal, so a numeric rate becomes the shortest decimal of its value ("1.0" →
 * "1", "0.50" → "0.5"); any other label is only trimmed.
 *
 * Common practice, no published source.
 *
 * @param rate - the rate as typed or imported
 * @returns the rate key
 * @throws Error when the rate is empty
 * @example normalizeRate('1.0') // '1'
 */
export function normalizeRate(rate: string | number): string {
  const text = String(rate).trim();
  if (text === '') throw new Error('normalizeRate needs a non-empty rate');
  if (typeof rate === 'number' || NUMBER.test(text)) {
    const value = Number(text);
    if (Number.isFinite(value)) return String(value);
  }
  return text;
}
