// Quadratic response of yield to seeding rate, with agronomic and economic optimum rates.
import { Matrix, inverse } from 'ml-matrix';
import type { OptimumFlag, Prices, ResponseCurve } from './types';

/**
 * Fits y = b0 + b1·x + b2·x² by ordinary least squares and reports coefficient SEs, R², the
 * agronomic optimum x = −b1/(2·b2) (maximum yield) and, with prices, the economic optimum
 * where the marginal yield value equals the marginal seed cost:
 * b1 + 2·b2·x = seed price per rate unit ÷ grain price per yield unit.
 * An optimum outside the tested rates is not extrapolated: the value is null and the flag
 * says "beyond the tested rates"; a curve that is not concave (b2 ≥ 0) has no maximum and
 * is flagged "curve not concave".
 *
 * Source: Gomez & Gomez (1984), ch. 9.2 (polynomial regression); Fausti et al. (2017),
 * Practical Mathematics, ASA-CSSA-SSSA, doi:10.2134/practicalmath2016.0027 (marginal rule).
 *
 * @param points - (rate, value) pairs, e.g. site × rate mean yields; ≥ 4 points, ≥ 3 rates
 * @param prices - optional seed and grain prices with their units
 * @returns the fitted curve
 * @throws Error with too few points or distinct rates, non-finite values, or bad prices
 * @example fitQuadraticResponse(gomezPlots).agronomicOptimum // 29.148 (R 4.2.2 lm(y ~ x + I(x^2)))
 */
export function fitQuadraticResponse(
  points: readonly { rate: number; value: number }[],
  prices?: Prices,
): ResponseCurve {
  const n = points.length;
  for (const point of points) {
    if (!Number.isFinite(point.rate) || !Number.isFinite(point.value)) {
      throw new Error('fitQuadraticResponse needs finite rates and values');
    }
  }
  const distinct = new Set(points.map((point) => point.rate)).size;
  if (n < 4 || distinct < 3) {
    throw new Error(
      `fitQuadraticResponse needs at least 4 points at 3 or more rates (got ${n} points, ${distinct} rates)`,
    );
  }
  if (
    prices !== undefined &&
    !(prices.seedPricePerRateUnit >= 0 && prices.grainPricePerYieldUnit > 0)
  ) {
    throw new Error('fitQuadraticResponse needs a seed price ≥ 0 and a grain price > 0');
  }
  // Centre and scale the rate so the normal equations stay well conditioned, then map back.
  let low = Infinity;
  let high = -Infinity;
  let rateSum = 0;
  let valueSum = 0;
  for (const point of points) {
    low = Math.min(low, point.rate);
    high = Math.max(high, point.rate);
    rateSum += point.rate;
    valueSum += point.value;
  }
  const centre = rateSum / n;
  const scale = (high - low) / 2;
  const crossProducts = Matrix.zeros(3, 3);
  const xty = [0, 0, 0];
  for (const point of points) {
    const z = (point.rate - centre) / scale;
    const row = [1, z, z * z];
    for (let a = 0; a < 3; a++) {
      xty[a]! += (row[a] as number) * point.value;
      for (let b = 0; b < 3; b++)
        crossProducts.set(a, b, crossProducts.get(a, b) + (row[a] as number) * (row[b] as number));
    }
  }
  const covariance = inverse(crossProducts);
  const c = [0, 1, 2].map((a) =>
    [0, 1, 2].reduce((s, b) => s + covariance.get(a, b) * (xty[b] as number), 0),
  );
  const [c0, c1, c2] = c as [number, number, number];
  let residualSs = 0;
  let totalSs = 0;
  const mean = valueSum / n;
  for (const point of points) {
    const z = (point.rate - centre) / scale;
    residualSs += (point.value - (c0 + c1 * z + c2 * z * z)) ** 2;
    totalSs += (point.value - mean) ** 2;
  }
  const residualDf = n - 3;
  const sigma2 = residualSs / residualDf;
  // x = centre + scale·z: b2 = c2/s², b1 = c1/s − 2·c2·m/s², b0 = c0 − c1·m/s + c2·m²/s².
  const m = centre;
  const s = scale;
  const transform = [
    [1, -m / s, (m * m) / (s * s)],
    [0, 1 / s, (-2 * m) / (s * s)],
    [0, 0, 1 / (s * s)],
  ];
  const coefficients = transform.map((row) =>
    row.reduce((sum, t, k) => sum + t * (c[k] as number), 0),
  );
  const variance = (row: number[]) =>
    row.reduce(
      (sum, ta, a) => sum + row.reduce((inner, tb, b) => inner + ta * covariance.get(a, b) * tb, 0),
      0,
    ) * sigma2;
  const [b0, b1, b2] = coefficients as [number, number, number];
  const curve: ResponseCurve = {
    model: 'quadratic',
    intercept: b0,
    linear: b1,
    quadratic: b2,
    standardErrors: {
      intercept: Math.sqrt(variance(transform[0] as number[])),
      linear: Math.sqrt(variance(transform[1] as number[])),
      quadratic: Math.sqrt(variance(transform[2] as number[])),
    },
    rSquared: totalSs > 0 ? 1 - residualSs / totalSs : 0,
    residualDf,
    points: n,
    testedRange: { low, high },
    agronomicOptimum: null,
  };
  const optimum = (slope: number): { value: number | null; flag?: OptimumFlag } => {
    if (!(b2 < 0)) return { value: null, flag: 'curve not concave' };
    const x = (slope - b1) / (2 * b2);
    return x >= low && x <= high ? { value: x } : { value: null, flag: 'beyond the tested rates' };
  };
  const agronomic = optimum(0);
  curve.agronomicOptimum = agronomic.value;
  if (agronomic.flag) curve.agronomicOptimumFlag = agronomic.flag;
  if (prices !== undefined) {
    const priceRatio = prices.seedPricePerRateUnit / prices.grainPricePerYieldUnit;
    const economic = optimum(priceRatio);
    curve.economicOptimum = economic.value;
    if (economic.flag) curve.economicOptimumFlag = economic.flag;
    curve.economics = {
      seedPricePerRateUnit: prices.seedPricePerRateUnit,
      grainPricePerYieldUnit: prices.grainPricePerYieldUnit,
      rateUnit: prices.rateUnit,
      yieldUnit: prices.yieldUnit,
      priceRatio,
      explanation: `Seed costs ${prices.seedPricePerRateUnit} per ${prices.rateUnit}; grain is worth ${prices.grainPricePerYieldUnit} per ${prices.yieldUnit}. The economic optimum is the rate (in ${prices.rateUnit}) where one more ${prices.rateUnit} of seed adds ${priceRatio.toPrecision(4)} ${prices.yieldUnit} of yield.`,
    };
  }
  return curve;
}
