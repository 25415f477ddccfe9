// Upper-tail p-value of an F ratio.
import { regularizedBetaTails } from './regularized-beta-tails';

/**
 * Upper-tail probability of the F distribution, P(F > f) = I_y(df2/2, df1/2) with
 * y = df2/(df2 + df1·f), computed directly (not as 1 − CDF), so p-values far below 1e-16
 * keep full relative precision. Same quantity as R's `pf(f, df1, df2, lower.tail = FALSE)`;
 * degrees of freedom need not be whole numbers (Kenward–Roger df).
 *
 * Source: Abramowitz & Stegun (1964), 26.6.2 and 26.5.8.
 *
 * @param f - the F ratio, ≥ 0
 * @param df1 - numerator degrees of freedom, > 0
 * @param df2 - denominator degrees of freedom, > 0
 * @returns the p-value
 * @throws Error when f is negative or not finite, or a df is not positive
 * @example fUpperTailP(2.16777868149536, 5, 15) // 0.112809412634841 (R 4.2.2: pf(..., lower.tail = FALSE))
 */
export function fUpperTailP(f: number, df1: number, df2: number): number {
  if (!(f >= 0) || !Number.isFinite(f))
    throw new Error(`fUpperTailP needs a finite f ≥ 0 (got ${f})`);
  if (!(df1 > 0 && df2 > 0) || !Number.isFinite(df1) || !Number.isFinite(df2))
    throw new Error(`fUpperTailP needs positive degrees of freedom (got ${df1}, ${df2})`);
  if (f === 0) return 1;
  const total = df2 + df1 * f;
  return regularizedBetaTails(df2 / total, df2 / 2, df1 / 2, (df1 * f) / total).lower;
}
