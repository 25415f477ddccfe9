// Two-sided p-value of a t statistic.
import { regularizedBetaTails } from './regularized-beta-tails';
import { regularizedGammaTails } from './regularized-gamma-tails';

/**
 * Two-sided tail probability of Student's t distribution, 2·P(T > |t|), computed directly
 * as I_x(df/2, 1/2) with x = df/(df + t²) (never as 1 − CDF), so small p-values keep full
 * relative precision. Same quantity as R's `2 * pt(-abs(t), df)`; df need not be a whole
 * number (Kenward–Roger df).
 *
 * Source: Abramowitz & Stegun (1964), 26.7.1 and 26.5.27; Snedecor & Cochran (1989),
 * Statistical Methods, 8th ed., ch. 5.
 *
 * @param t - the t statistic
 * @param df - degrees of freedom, > 0
 * @returns the two-sided p-value, in [0, 1]
 * @throws Error when t is not finite or df is not positive
 * @example studentTTwoSidedP(2.5, 6) // 0.0465282322841673 (R 4.2.2: 2 * pt(-2.5, 6))
 */
export function studentTTwoSidedP(t: number, df: number): number {
  if (!Number.isFinite(t)) throw new Error(`studentTTwoSidedP needs a finite t (got ${t})`);
  if (!(df > 0)) throw new Error(`studentTTwoSidedP needs df > 0 (got ${df})`);
  if (t === 0) return 1;
  const square = t * t;
  // Normal limit: P(|Z| > |t|) = P(χ²₁ > t²).
  if (df === Infinity) return regularizedGammaTails(0.5, square / 2).upper;
  const total = df + square;
  return regularizedBetaTails(df / total, df / 2, 0.5, square / total).lower;
}
