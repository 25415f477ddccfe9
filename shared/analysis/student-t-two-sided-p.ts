// Two-sided p-value of a t statistic.
import jStat from 'jstat';

/**
 * Two-sided tail probability of Student's t distribution, 2·P(T > |t|). Same quantity as
 * R's `2 * pt(-abs(t), df)`.
 *
 * Source: Snedecor & Cochran (1989), Statistical Methods, 8th ed., ch. 5.
 *
 * @param t - the t statistic
 * @param df - degrees of freedom, > 0
 * @returns the two-sided p-value, in [0, 1]
 * @throws Error when t is not finite or df is not positive
 * @example studentTTwoSidedP(2.5, 6) // 0.046528 (R 4.2.2: 2 * pt(-2.5, 6))
 */
export function studentTTwoSidedP(t: number, df: number): number {
  if (!Number.isFinite(t)) throw new Error(`studentTTwoSidedP needs a finite t (got ${t})`);
  if (!(df > 0)) throw new Error(`studentTTwoSidedP needs df > 0 (got ${df})`);
  return Math.min(1, 2 * jStat.studentt.cdf(-Math.abs(t), df));
}
