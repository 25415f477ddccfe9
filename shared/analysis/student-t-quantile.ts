// Quantile of Student's t distribution, for confidence intervals and LSDs.
import jStat from 'jstat';

/**
 * Quantile (inverse cumulative distribution) of Student's t distribution, via jstat's
 * incomplete-beta inversion. Same quantity as R's `qt(p, df)`.
 *
 * Source: Abramowitz & Stegun (1964), Handbook of Mathematical Functions, 26.7.
 *
 * @param p - lower-tail probability, 0 < p < 1
 * @param df - degrees of freedom, > 0
 * @returns the t value with P(T ≤ t) = p
 * @throws Error when p is outside (0, 1) or df is not positive
 * @example studentTQuantile(0.975, 15) // 2.131450 (R 4.2.2: qt(0.975, 15) = 2.131449546)
 */
export function studentTQuantile(p: number, df: number): number {
  if (!(p > 0 && p < 1)) throw new Error(`studentTQuantile needs 0 < p < 1 (got ${p})`);
  if (!(df > 0)) throw new Error(`studentTQuantile needs df > 0 (got ${df})`);
  return jStat.studentt.inv(p, df);
}
