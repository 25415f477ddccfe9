// Number text without the browser's locale data at start-up. The first Intl formatter a page makes
// (or the first toLocaleString) loads that data: 21–45 ms per page in headless Chromium without
// throttling, more on a phone, inside the task that draws the page. So formatters kept at module level are made on first
// use, and the strip values a grower's site page shows first are written by groupedDecimal, which
// needs no locale data. Our own code rather than a package: it is a dozen lines, and a
// number-formatting package would load the same data or ship its own.

/** A formatter (Intl.NumberFormat, Intl.DateTimeFormat…) made the first time it is asked for. */
export function onFirstUse<T>(make: () => T): () => T {
  let made: T | undefined;
  return () => (made ??= make());
}

const THOUSANDS = /\B(?=(\d{3})+(?!\d))/g;

/**
 * `value` with exactly `decimals` decimals and commas between thousands ("12,345.6"), rounded half
 * away from zero on the number as written (1.45 → "1.5", as a grower who typed 1.45 expects): the
 * text `Intl.NumberFormat('en', { minimumFractionDigits: decimals, maximumFractionDigits: decimals })`
 * gives.
 *
 * @example groupedDecimal(12345.65, 1) // '12,345.7'
 * @example groupedDecimal(0.5, 0) // '1'
 */
export function groupedDecimal(value: number, decimals: number): string {
  const written = Math.abs(value).toString();
  // Tiny or huge magnitudes are written with an exponent; no field value comes near them.
  if (written.includes('e') || !Number.isInteger(decimals) || decimals < 0 || decimals > 15)
    return value.toLocaleString('en', {
      minimumFractionDigits: decimals,
      maximumFractionDigits: decimals,
    });
  // Rounded in the text itself: 1.45 is a hair below 1.45 in binary, and scaling it by 10 in
  // binary arithmetic can round it again.
  const [integer, fraction = ''] = written.split('.');
  const kept = `${integer}${fraction.slice(0, decimals).padEnd(decimals, '0')}`;
  const roundUp = (fraction[decimals] ?? '0') >= '5';
  const scaled = (roundUp ? (BigInt(kept) + 1n).toString() : kept).padStart(decimals + 1, '0');
  const whole = scaled.slice(0, scaled.length - decimals).replace(THOUSANDS, ',');
  const sign = value < 0 || Object.is(value, -0) ? '-' : '';
  return decimals === 0 ? `${sign}${whole}` : `${sign}${whole}.${scaled.slice(-decimals)}`;
}
