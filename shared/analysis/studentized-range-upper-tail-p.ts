// Upper-tail probability of the studentized range distribution (Tukey p-values).
import jStat from 'jstat';

/**
 * Upper-tail probability of the studentized range, P(Q > q; k, df), as R's
 * `ptukey(q, k, df, lower.tail = FALSE)`. jstat ports R's algorithm (Copenhaver & Holland
 * 1988); accuracy is about 4 decimals, as in R.
 *
 * Source: Copenhaver, M.D. & Holland, B. (1988) J. Stat. Comput. Simul. 30:1–15.
 *
 * @param q - studentized range, ≥ 0
 * @param means - number of means (k ≥ 2)
 * @param df - error degrees of freedom, > 0
 * @returns the p-value
 * @throws Error when an argument is out of range
 * @example studentizedRangeUpperTailP(4, 4, 15) // 0.05529 (R 4.2.2: ptukey(4, 4, 15, lower.tail = FALSE))
 */
export function studentizedRangeUpperTailP(q: number, means: number, df: number): number {
  if (!(q >= 0) || !Number.isFinite(q)) {
    throw new Error(`studentizedRangeUpperTailP needs a finite q ≥ 0 (got ${q})`);
  }
  if (!Number.isInteger(means) || means < 2) {
    throw new Error(`studentizedRangeUpperTailP needs at least 2 means (got ${means})`);
  }
  if (!(df > 0)) throw new Error(`studentizedRangeUpperTailP needs df > 0 (got ${df})`);
  return Math.min(1, Math.max(0, 1 - jStat.tukey.cdf(q, means, df)));
}
