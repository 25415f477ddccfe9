// Quantile of the chi-square distribution.
import jStat from 'jstat';
import { polishQuantile } from './polish-quantile';
import { regularizedGammaTails } from './regularized-gamma-tails';

/**
 * Quantile of the chi-square distribution, as R's `qchisq(p, df)`. jstat's inversion gives
 * a start; Newton steps on the directly computed tail (the upper tail when p > ½) polish it
 * to machine precision.
 *
 * Source: Abramowitz & Stegun (1964), 26.4.
 *
 * @param p - lower-tail probability, 0 < p < 1
 * @param df - degrees of freedom, > 0
 * @returns x with P(X ≤ x) = p
 * @throws Error when p is outside (0, 1) or df is not positive
 * @example chiSquareQuantile(0.95, 1) // 3.84145882069412 (R 4.2.2: qchisq(0.95, 1))
 */
export function chiSquareQuantile(p: number, df: number): number {
  if (!(p > 0 && p < 1)) throw new Error(`chiSquareQuantile needs 0 < p < 1 (got ${p})`);
  if (!(df > 0) || !Number.isFinite(df))
    throw new Error(`chiSquareQuantile needs a finite df > 0 (got ${df})`);
  let start = jStat.chisquare.inv(p, df);
  if (!(start > 0) || !Number.isFinite(start)) start = df;
  const density = (x: number) => jStat.chisquare.pdf(x, df);
  return p > 0.5
    ? polishQuantile(
        start,
        (x) => regularizedGammaTails(df / 2, x / 2).upper,
        density,
        1 - p,
        'upper',
      )
    : polishQuantile(start, (x) => regularizedGammaTails(df / 2, x / 2).lower, density, p, 'lower');
}
