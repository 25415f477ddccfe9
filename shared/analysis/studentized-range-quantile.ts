// Quantile of the studentized range distribution, for Tukey's HSD.
import jStat from 'jstat';
import { studentTQuantile } from './student-t-quantile';

const cache = new Map<string, number>();

/**
 * Quantile of the studentized range distribution q(p; k, df), as R's `qtukey(p, k, df)`.
 *
 * jstat 1.9.6 ports R's `qtukey`/`ptukey` (Copenhaver & Holland 1988, Gauss–Legendre
 * quadrature) and agrees with R 4.2.2 to ~1e-12 on the reference table; like R it is only
 * accurate to about 4 decimals (it is 1.7e-5 high for k = 2, df = 4). Two improvements here:
 * for k = 2 the exact identity q = √2 · t(1 − (1 − p)/2, df) is used, and results are
 * memoised because one call costs ~10 ms and every site of a network shares k and df.
 *
 * Source: Tukey (1953); Copenhaver, M.D. & Holland, B. (1988) J. Stat. Comput. Simul. 30:1–15.
 *
 * @param p - lower-tail probability, 0 < p < 1 (0.95 for a 5% HSD)
 * @param means - number of means compared (k ≥ 2)
 * @param df - error degrees of freedom, > 0
 * @returns the quantile q
 * @throws Error when p, means or df are out of range
 * @example studentizedRangeQuantile(0.95, 6, 15) // 4.594735 (R 4.2.2: qtukey(0.95, 6, 15))
 */
export function studentizedRangeQuantile(p: number, means: number, df: number): number {
  if (!(p > 0 && p < 1)) throw new Error(`studentizedRangeQuantile needs 0 < p < 1 (got ${p})`);
  if (!Number.isInteger(means) || means < 2) {
    throw new Error(`studentizedRangeQuantile needs at least 2 means (got ${means})`);
  }
  if (!(df > 0)) throw new Error(`studentizedRangeQuantile needs df > 0 (got ${df})`);
  const key = `${p}|${means}|${df}`;
  const known = cache.get(key);
  if (known !== undefined) return known;
  const q =
    means === 2
      ? Math.SQRT2 * studentTQuantile(1 - (1 - p) / 2, df)
      : jStat.tukey.inv(p, means, df);
  if (!Number.isFinite(q)) {
    throw new Error(`studentizedRangeQuantile could not converge for p=${p}, k=${means}, df=${df}`);
  }
  if (cache.size > 500) cache.clear();
  cache.set(key, q);
  return q;
}
