// Quantile of the F distribution, for critical values of F tests.
import jStat from 'jstat';
import { polishQuantile } from './polish-quantile';
import { regularizedBetaTails } from './regularized-beta-tails';

/**
 * Quantile of the F distribution, as R's `qf(p, df1, df2)`. jstat's inversion gives a start;
 * Newton steps on the directly computed tail (the upper tail when p > ½) polish it to
 * machine precision. Degrees of freedom need not be whole numbers.
 *
 * Source: Abramowitz & Stegun (1964), 26.6.
 *
 * @param p - lower-tail probability, 0 < p < 1
 * @param df1 - numerator degrees of freedom, > 0
 * @param df2 - denominator degrees of freedom, > 0
 * @returns f with P(F ≤ f) = p
 * @throws Error when p is outside (0, 1) or a df is not positive
 * @example fQuantile(0.95, 3, 15) // 3.28738210067163 (R 4.2.2: qf(0.95, 3, 15))
 */
export function fQuantile(p: number, df1: number, df2: number): number {
  if (!(p > 0 && p < 1)) throw new Error(`fQuantile needs 0 < p < 1 (got ${p})`);
  if (!(df1 > 0 && df2 > 0) || !Number.isFinite(df1) || !Number.isFinite(df2))
    throw new Error(`fQuantile needs positive finite degrees of freedom (got ${df1}, ${df2})`);
  const tails = (f: number) => {
    const total = df2 + df1 * f;
    return regularizedBetaTails(df2 / total, df2 / 2, df1 / 2, (df1 * f) / total);
  };
  let start = jStat.centralF.inv(p, df1, df2);
  if (!(start > 0) || !Number.isFinite(start)) start = 1;
  const density = (f: number) => jStat.centralF.pdf(f, df1, df2);
  return p > 0.5
    ? polishQuantile(start, (f) => tails(f).lower, density, 1 - p, 'upper')
    : polishQuantile(start, (f) => tails(f).upper, density, p, 'lower');
}
