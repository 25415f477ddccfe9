// Upper-tail p-value of a chi-square statistic.
import { regularizedGammaTails } from './regularized-gamma-tails';

/**
 * Upper-tail probability of the chi-square distribution, P(X > x) = Q(df/2, x/2), the
 * regularized upper incomplete gamma function computed directly (not as 1 − CDF), so
 * p-values far below 1e-16 keep full relative precision. Same quantity as R's
 * `pchisq(x, df, lower.tail = FALSE)`.
 *
 * Source: Abramowitz & Stegun (1964), 26.4.19 and 6.5.31.
 *
 * @param x - the statistic, ≥ 0
 * @param df - degrees of freedom, > 0
 * @returns the p-value
 * @throws Error when x is negative or not finite, or df is not positive
 * @example chiSquareUpperTailP(3.84145882069412, 1) // 0.05 (R 4.2.2)
 */
export function chiSquareUpperTailP(x: number, df: number): number {
  if (!(x >= 0) || !Number.isFinite(x))
    throw new Error(`chiSquareUpperTailP needs a finite x ≥ 0 (got ${x})`);
  if (!(df > 0) || !Number.isFinite(df))
    throw new Error(`chiSquareUpperTailP needs df > 0 (got ${df})`);
  return regularizedGammaTails(df / 2, x / 2).upper;
}
