// Newton refinement of a distribution quantile on the logarithm of the tail probability.

/**
 * Refines an approximate quantile x of a continuous distribution so that its tail
 * probability equals `target`, by Newton's method on log(tail): x ← x ± (log tail(x) −
 * log target)·tail(x)/density(x). Working on the log keeps the steps sensible far out in a
 * tail. The density only sets the step size, so an approximate density still converges to
 * the exact root of the (exact) tail function.
 *
 * Source: Press et al. (2007) Numerical Recipes, 3rd ed., 9.4 (Newton–Raphson); the same
 * final-polish idea as R's `qbeta`/`qgamma` (R Core, nmath).
 *
 * @param start - approximate quantile inside the support
 * @param tail - the tail probability to match (upper: P(X > x); lower: P(X ≤ x))
 * @param density - the density (may be approximate)
 * @param target - wanted tail probability, in (0, 1)
 * @param side - 'upper' or 'lower': which tail `tail` computes
 * @param low - lower end of the support (default 0)
 * @returns x with tail(x) = target to about machine precision
 * @throws Error when start is not finite or target is outside (0, 1)
 * @example polishQuantile(1.9, (x) => Math.exp(-x), (x) => Math.exp(-x), 0.125, 'upper') // 2.0794415416798357 (= log 8)
 */
export function polishQuantile(
  start: number,
  tail: (x: number) => number,
  density: (x: number) => number,
  target: number,
  side: 'upper' | 'lower',
  low = 0,
): number {
  if (!Number.isFinite(start))
    throw new Error(`polishQuantile needs a finite start (got ${start})`);
  if (!(target > 0 && target < 1))
    throw new Error(`polishQuantile needs 0 < target < 1 (got ${target})`);
  const logTarget = Math.log(target);
  let x = start;
  let best = x;
  let bestGap = Infinity;
  for (let iteration = 0; iteration < 100; iteration++) {
    const probability = tail(x);
    const gap = Math.abs(probability - target);
    if (gap < bestGap) {
      bestGap = gap;
      best = x;
    }
    if (gap === 0) return x;
    const slope = density(x);
    if (!(slope > 0) || !(probability > 0)) break;
    const step = ((Math.log(probability) - logTarget) * probability) / slope;
    let next = side === 'upper' ? x + step : x - step;
    if (next <= low) next = (x + low) / 2;
    if (Math.abs(next - x) <= 2e-16 * Math.abs(x) || next === x) return bestGap <= gap ? best : x;
    x = next;
  }
  return best;
}
