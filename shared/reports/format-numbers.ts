// Number wording for report text and tables: thousands separators, sensible decimals, p-values.

/**
 * Decimals that suit a quantity of this size: none from 1,000 up (kg/ha), one from 10 up
 * (bu/acre), two below (t/ha: 4.52).
 *
 * @param scale - a typical value of the quantity (e.g. the grand mean)
 * @returns number of decimals
 * @example decimalsFor(62.4) // 1
 */
export function decimalsFor(scale: number): number {
  const size = Math.abs(scale);
  if (size >= 1000) return 0;
  if (size >= 10) return 1;
  return 2;
}

/**
 * Decimals for a squared yield (sums of squares, mean squares): the yield's own, but twice as
 * many when it shows two, so a mean square in (t/ha)² keeps its figures (0.0412, not 0.04).
 *
 * @param yieldDecimals - the decimals the yield itself is shown with (from decimalsFor)
 * @returns number of decimals
 * @example squaredDecimals(2) // 4
 * @example squaredDecimals(1) // 1
 */
export function squaredDecimals(yieldDecimals: number): number {
  return yieldDecimals >= 2 ? 2 * yieldDecimals : yieldDecimals;
}

/**
 * Formats a variance (a squared yield, whose size depends on the unit: about 50,000 in (kg/ha)²,
 * 0.05 in (t/ha)²) to three significant figures, so a small one never reads 0.000.
 *
 * @example formatVariance(0.004321) // '0.00432'
 * @example formatVariance(51234.5) // '51,200'
 * @example formatVariance(0) // '0'
 */
export function formatVariance(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  if (value === 0) return '0';
  const magnitude = Math.floor(Math.log10(Math.abs(value)));
  const decimals = Math.min(8, Math.max(0, 2 - magnitude));
  // Large values are rounded to their three leading figures; small ones by their decimals.
  const step = magnitude > 2 ? 10 ** (magnitude - 2) : 1;
  return formatNumber(magnitude > 2 ? Math.round(value / step) * step : value, decimals);
}

/**
 * Formats a number with thousands separators and a fixed number of decimals; "–" when missing.
 *
 * @example formatNumber(5124.25, 0) // '5,124'
 */
export function formatNumber(value: number | null | undefined, decimals = 1): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  const rounded = Number(value.toFixed(decimals));
  // Avoid "-0.0" after rounding.
  const clean = Object.is(rounded, -0) ? 0 : rounded;
  return clean.toLocaleString('en-US', {
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
  });
}

/**
 * Formats a p-value the way agronomy reports print it.
 *
 * @example formatP(0.00042) // 'p < 0.001'
 * @example formatP(0.1128) // 'p = 0.11'
 */
export function formatP(p: number): string {
  if (!Number.isFinite(p)) return 'p not available';
  if (p < 0.001) return 'p < 0.001';
  if (p < 0.01) return `p = ${p.toFixed(3)}`;
  return `p = ${p.toFixed(2)}`;
}

/**
 * Formats money with a sign and the currency symbol.
 *
 * @example formatMoney(-3.456) // '−$3.46'
 */
export function formatMoney(value: number | null | undefined, symbol = '$'): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  const text = `${symbol}${formatNumber(Math.abs(value), 2)}`;
  return value < -0.005 ? `−${text}` : text;
}
