// Upper-tail p-value of an F ratio.
import jStat from 'jstat';

/**
 * Upper-tail probability of the F distribution, P(F > f). Same quantity as R's
 * `pf(f, df1, df2, lower.tail = FALSE)`. Computed as the lower tail of 1/f with the degrees
 * of freedom swapped, which keeps precision for small p-values.
 *
 * Source: Abramowitz & Stegun (1964), 26.6.
 *
 * @param f - the F ratio, ≥ 0
 * @param df1 - numerator degrees of freedom, > 0
 * @param df2 - denominator degrees of freedom, > 0
 * @returns the p-value
 * @throws Error when f is negative or not finite, or a df is not positive
 * @example fUpperTailP(2.16777868149536, 5, 15) // 0.1128094 (R 4.2.2: pf(..., lower.tail = FALSE))
 */
export function fUpperTailP(f: number, df1: number, df2: number): number {
  if (!(f >= 0) || !Number.isFinite(f))
    throw new Error(`fUpperTailP needs a finite f ≥ 0 (got ${f})`);
  if (!(df1 > 0 && df2 > 0))
    throw new Error(`fUpperTailP needs positive degrees of freedom (got ${df1}, ${df2})`);
  if (f === 0) return 1;
  return jStat.centralF.cdf(1 / f, df2, df1);
}
