// Dunnett (many-to-one) adjusted p-values and simultaneous intervals for differences from a reference.
import { multivariateTBoxProbability } from './multivariate-t-box-probability';
import { studentTQuantile } from './student-t-quantile';

/** Critical values are pure functions of (correlation, df, alpha); sites alike share them. */
const criticalCache = new Map<string, number>();

export type ManyToOneAdjustment = {
  /** Single-step adjusted p: 1 − P(max_i |T_i| ≤ |t_j|). */
  pAdjusted: number;
  /** Critical value c with P(max_i |T_i| ≤ c) = 1 − α, for this contrast's df. */
  criticalValue: number;
  ciLowAdjusted: number;
  ciHighAdjusted: number;
};

/**
 * Dunnett's single-step adjustment for comparing several rates with one reference rate:
 * the contrasts' t statistics are jointly multivariate t with the correlation of their
 * estimates. Contrast j uses its own degrees of freedom (e.g. its Kenward–Roger df, not
 * rounded): its adjusted p is 1 − P(max_i |T_i| ≤ |t_j|; R, ν_j) and its simultaneous
 * interval is estimate ± c_j·SE with P(max_i |T_i| ≤ c_j; R, ν_j) = 1 − α. With one error df
 * for all contrasts (one site) this is R's `multcomp::glht(..., mcp(rate = "Dunnett"))`.
 *
 * Source: Dunnett, C.W. (1955) JASA 50:1096–1121; Hothorn, Bretz & Westfall (2008) Biometrical
 * Journal 50:346–363 (single-step multivariate t adjustment).
 *
 * @param estimates - contrast estimates (rate − reference)
 * @param covariance - their covariance matrix
 * @param df - degrees of freedom of each contrast
 * @param alpha - family-wise error rate for the intervals (default 0.05)
 * @returns one adjustment per contrast
 * @throws Error when sizes disagree, a variance is not positive or alpha is outside (0, 1)
 * @example adjustManyToOne([276.25], [[55279.2]], [15])[0].pAdjusted // = unadjusted t-test p for one contrast
 */
export function adjustManyToOne(
  estimates: readonly number[],
  covariance: readonly (readonly number[])[],
  df: readonly number[],
  alpha = 0.05,
): ManyToOneAdjustment[] {
  const m = estimates.length;
  if (covariance.length !== m || df.length !== m)
    throw new Error('adjustManyToOne needs one covariance row and one df per estimate');
  if (!(alpha > 0 && alpha < 1))
    throw new Error(`adjustManyToOne needs 0 < alpha < 1 (got ${alpha})`);
  if (m === 0) return [];
  const se = covariance.map((row, i) => Math.sqrt(row[i]!));
  if (!se.every((s) => s > 0 && Number.isFinite(s)))
    throw new Error('adjustManyToOne needs positive variances');
  const correlation = covariance.map((row, i) =>
    row.map((v, j) => (i === j ? 1 : v / (se[i]! * se[j]!))),
  );
  const criticalByDf = new Map<number, number>();
  const critical = (nu: number): number => {
    const known = criticalByDf.get(nu);
    if (known !== undefined) return known;
    const key = `${alpha}|${nu}|${correlation.map((row) => row.map((v) => v.toPrecision(12)).join(',')).join(';')}`;
    let value = criticalCache.get(key);
    if (value === undefined) {
      value = solveCritical(correlation, nu, alpha, m);
      if (criticalCache.size > 500) criticalCache.clear();
      criticalCache.set(key, value);
    }
    criticalByDf.set(nu, value);
    return value;
  };
  return estimates.map((estimate, j) => {
    const nu = df[j]!;
    const t = Math.abs(estimate / se[j]!);
    const c = critical(nu);
    return {
      pAdjusted: Math.min(1, Math.max(0, 1 - multivariateTBoxProbability(correlation, t, nu))),
      criticalValue: c,
      ciLowAdjusted: estimate - c * se[j]!,
      ciHighAdjusted: estimate + c * se[j]!,
    };
  });
}

/** Illinois (modified regula falsi) between the unadjusted and the Bonferroni critical values. */
function solveCritical(
  correlation: readonly (readonly number[])[],
  df: number,
  alpha: number,
  m: number,
): number {
  const target = 1 - alpha;
  const quantile = (p: number) => studentTQuantile(p, Math.min(df, 1e9));
  let low = quantile(1 - alpha / 2);
  let high = quantile(1 - alpha / (2 * m));
  if (m === 1 || high - low < 1e-14) return low;
  let fLow = multivariateTBoxProbability(correlation, low, df) - target;
  let fHigh = multivariateTBoxProbability(correlation, high, df) - target;
  if (fLow >= 0) return low;
  if (fHigh <= 0) return high;
  let side = 0;
  let x = low;
  for (let iteration = 0; iteration < 60; iteration++) {
    x = (low * fHigh - high * fLow) / (fHigh - fLow);
    const fx = multivariateTBoxProbability(correlation, x, df) - target;
    if (Math.abs(fx) < 1e-13 || high - low < 1e-11 * x) break;
    if (fx > 0) {
      high = x;
      fHigh = fx;
      if (side === 1) fLow /= 2;
      side = 1;
    } else {
      low = x;
      fLow = fx;
      if (side === -1) fHigh /= 2;
      side = -1;
    }
  }
  return x;
}
