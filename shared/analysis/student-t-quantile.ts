// Quantile of Student's t distribution, for confidence intervals and LSDs.
import jStat from 'jstat';
import { polishQuantile } from './polish-quantile';
import { regularizedBetaTails } from './regularized-beta-tails';

/**
 * Quantile (inverse cumulative distribution) of Student's t distribution, as R's
 * `qt(p, df)`. jstat's incomplete-beta inversion gives a start (up to 3.5e-8 off); Newton
 * steps on the directly computed tail P(T > t) = ½·I_{df/(df+t²)}(df/2, ½) then bring it to
 * machine precision. df need not be a whole number (Kenward–Roger df).
 *
 * Source: Abramowitz & Stegun (1964), Handbook of Mathematical Functions, 26.7.
 *
 * @param p - lower-tail probability, 0 < p < 1
 * @param df - degrees of freedom, > 0
 * @returns the t value with P(T ≤ t) = p
 * @throws Error when p is outside (0, 1) or df is not positive
 * @example studentTQuantile(0.975, 15) // 2.13144954555978 (R 4.2.2: qt(0.975, 15))
 */
export function studentTQuantile(p: number, df: number): number {
  if (!(p > 0 && p < 1)) throw new Error(`studentTQuantile needs 0 < p < 1 (got ${p})`);
  if (!(df > 0) || !Number.isFinite(df))
    throw new Error(`studentTQuantile needs a finite df > 0 (got ${df})`);
  if (p === 0.5) return 0;
  const target = p > 0.5 ? 1 - p : p;
  const upperTail = (t: number) => {
    const square = t * t;
    const total = df + square;
    return 0.5 * regularizedBetaTails(df / total, df / 2, 0.5, square / total).lower;
  };
  let start = Math.abs(jStat.studentt.inv(target, df));
  if (!Number.isFinite(start) || start === 0) start = 1;
  const t = polishQuantile(start, upperTail, (x) => jStat.studentt.pdf(x, df), target, 'upper');
  return p > 0.5 ? t : -t;
}
