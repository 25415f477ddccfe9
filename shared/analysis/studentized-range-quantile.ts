// Quantile of the studentized range distribution, for Tukey's HSD.
import jStat from 'jstat';
import { studentTQuantile } from './student-t-quantile';

const cache = new Map<string, number>();

/**
 * Quantile of the studentized range distribution q(p; k, df), as R's `qtukey(p, k, df)`.
 *
 * jstat 1.9.6 ports R's `qtukey`/`ptukey` (Copenhaver & Holland 1988, Gauss–Legendre
 * quadrature). R's `qtukey` stops its secant search at 1e-4, so here jstat's answer is only
 * a start: secant steps on jstat's `ptukey` (which agrees with R's to ~1e-12) solve
 * ptukey(q) = p to 1e-12, i.e. R's `uniroot(function(q) ptukey(q, k, df) - p)` run tightly.
 * For k = 2 the exact identity q = √2 · t(1 − (1 − p)/2, df) is used (R's ptukey is 1.7e-5
 * high at df = 4). Results are memoised because one call costs ~10 ms and every site of a
 * network shares k and df.
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
      : polish(jStat.tukey.inv(p, means, df), p, means, df);
  if (!Number.isFinite(q)) {
    throw new Error(`studentizedRangeQuantile could not converge for p=${p}, k=${means}, df=${df}`);
  }
  if (cache.size > 500) cache.clear();
  cache.set(key, q);
  return q;
}

function polish(start: number, p: number, means: number, df: number): number {
  let x0 = start;
  let f0 = jStat.tukey.cdf(x0, means, df) - p;
  let x1 = start * (1 + 1e-6);
  let f1 = jStat.tukey.cdf(x1, means, df) - p;
  for (let iteration = 0; iteration < 30 && f1 !== f0; iteration++) {
    const x2 = x1 - (f1 * (x1 - x0)) / (f1 - f0);
    if (!Number.isFinite(x2) || x2 <= 0) break;
    x0 = x1;
    f0 = f1;
    x1 = x2;
    f1 = jStat.tukey.cdf(x1, means, df) - p;
    if (Math.abs(x1 - x0) < 1e-12 * x1) break;
  }
  return Math.abs(f1) <= Math.abs(f0) ? x1 : x0;
}
