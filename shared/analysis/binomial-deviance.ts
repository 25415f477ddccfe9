// Deviance term x·log(x/μ) + μ − x, computed without cancellation when x is near μ.

/**
 * The "bd0" deviance term D(x, μ) = x·log(x/μ) + μ − x ≥ 0. When x and μ are close the
 * naive formula loses every digit; there the series 2x·Σ v^(2j+1)/(2j+1) with
 * v = (x − μ)/(x + μ) is summed instead.
 *
 * Source: Loader, C. (2000) "Fast and accurate computation of binomial probabilities"
 * (the `bd0` of R's nmath).
 *
 * @param x - a non-negative number
 * @param mean - a positive number μ
 * @returns D(x, μ)
 * @throws Error when x < 0 or μ ≤ 0
 * @example binomialDeviance(10, 8) // 0.231435513142098 (= 10·log(10/8) − 2; R 4.2.2)
 */
export function binomialDeviance(x: number, mean: number): number {
  if (!(x >= 0) || !(mean > 0) || !Number.isFinite(x) || !Number.isFinite(mean)) {
    throw new Error(`binomialDeviance needs x ≥ 0 and mean > 0 (got ${x}, ${mean})`);
  }
  if (x === 0) return mean;
  if (Math.abs(x - mean) < 0.1 * (x + mean)) {
    let v = (x - mean) / (x + mean);
    let sum = (x - mean) * v;
    if (Math.abs(sum) < Number.MIN_VALUE) return sum;
    let term = 2 * x * v;
    v *= v;
    for (let j = 1; j < 1000; j++) {
      term *= v;
      const next = sum + term / (2 * j + 1);
      if (next === sum) return next;
      sum = next;
    }
    return sum;
  }
  return x * Math.log(x / mean) + mean - x;
}
