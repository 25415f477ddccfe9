// Quadratic, linear-plateau and quadratic-plateau responses to seeding rate with site effects removed.
import { Matrix, inverse } from 'ml-matrix';
import { studentTQuantile } from './student-t-quantile';

export type ResponseModelName = 'quadratic' | 'linear-plateau' | 'quadratic-plateau';

export type OptimumInterval = {
  value: number;
  ciLow: number;
  ciHigh: number;
  /** True when the value lies outside the tested rates (not extrapolated in words). */
  beyondTestedRates: boolean;
};

export type ResponseModel = {
  model: ResponseModelName;
  /** quadratic: linear, quadratic; plateau models: slope (or curvature) and join. */
  parameters: Record<string, number>;
  standardErrors: Record<string, number>;
  /** Mean site level: average of the site intercepts (quadratic) or plateaus. */
  meanIntercept: number;
  residualSs: number;
  residualDf: number;
  /** R's AIC(): n·log(2π·RSS/n) + n + 2·(parameters + 1). */
  aic: number;
  /** Share of the within-site variation (around each site's mean) the curve explains. */
  rSquaredWithinSites: number;
  agronomicOptimum: OptimumInterval | null;
  economicOptimum?: OptimumInterval | null;
};

export type ResponseModels = {
  models: ResponseModel[];
  /** The model with the smallest AIC. */
  chosen: ResponseModelName;
  intervalMethod: 'delta method';
  points: number;
  sites: number;
  testedRange: { low: number; high: number };
  priceRatio?: number;
  /** Economic optimum of the chosen model at several seed-to-grain price ratios. */
  economicTable?: { priceRatio: number; optimum: OptimumInterval | null }[];
};

type Point = { site: string; rate: number; value: number };

/**
 * Fits three response curves to site × rate means with a separate level for each site (site
 * effects removed, so the site-to-site variance does not enter the curve's errors):
 * quadratic y = a_s + b1·x + b2·x² (least squares, R's `lm(y ~ 0 + site + x + I(x^2))`);
 * linear-plateau y = P_s + b·(min(x, x0) − x0); quadratic-plateau y = P_s + c·(min(x, x0) − x0)²
 * (joined at the vertex). The plateau models are linear for a fixed join x0, so x0 is found by
 * minimising the profiled residual SS (golden section between each pair of tested rates above
 * the second lowest, so that slope and join are both identified) —
 * the least-squares solution R's `nls` converges to. The models are compared by AIC; R² is
 * within sites. Optimum rates get (1 − α) intervals by the delta method on the least-squares
 * (Gauss–Newton) covariance: agronomic optimum −b1/(2·b2) or the join x0; economic optimum
 * where the slope equals the seed-to-grain price ratio.
 *
 * Source: Cerrato, M.E. & Blackmer, A.M. (1990) Agron. J. 82:138–143 (comparing quadratic,
 * linear-plateau and quadratic-plateau models); Bates & Watts (1988) Nonlinear Regression
 * Analysis, ch. 2 (Gauss–Newton covariance); Akaike (1974) (AIC).
 *
 * @param points - site, numeric rate and mean value; ≥ 3 distinct rates
 * @param priceRatio - seed price per rate unit ÷ grain price per yield unit (optional)
 * @param alpha - 1 − confidence (default 0.05)
 * @returns the three fits, the AIC choice and, with a price ratio, a table across ratios
 * @throws Error with fewer than 3 distinct rates or too few points for the site levels
 * @example fitResponseModels(points).chosen // 'quadratic-plateau' (whichever AIC prefers)
 */
export function fitResponseModels(
  points: readonly Point[],
  priceRatio?: number,
  alpha = 0.05,
): ResponseModels {
  const siteNames = [...new Set(points.map((p) => p.site))];
  const rates = [...new Set(points.map((p) => p.rate))].sort((a, b) => a - b);
  if (rates.length < 3)
    throw new Error(`fitResponseModels needs at least 3 distinct rates (got ${rates.length})`);
  if (points.length < siteNames.length + 4)
    throw new Error('fitResponseModels needs more points than site levels plus 3');
  if (!points.every((p) => Number.isFinite(p.rate) && Number.isFinite(p.value)))
    throw new Error('fitResponseModels needs finite rates and values');
  const siteOf = points.map((p) => siteNames.indexOf(p.site));
  const y = points.map((p) => p.value);
  const x = points.map((p) => p.rate);
  const low = rates[0]!;
  const high = rates[rates.length - 1]!;
  const n = points.length;
  const s = siteNames.length;
  // Within-site SS: around each site's own mean.
  const siteMean = siteNames.map((_, k) => {
    const values = y.filter((_, i) => siteOf[i] === k);
    return values.reduce((a, b) => a + b, 0) / values.length;
  });
  const withinSs = y.reduce((sum, v, i) => sum + (v - siteMean[siteOf[i]!]!) ** 2, 0);

  /** Centres a column within each site (absorbs the site levels, Frisch–Waugh–Lovell). */
  const centre = (column: readonly number[]) => {
    const sums = new Float64Array(s);
    const counts = new Float64Array(s);
    column.forEach((v, i) => {
      sums[siteOf[i]!]! += v;
      counts[siteOf[i]!]! += 1;
    });
    return column.map((v, i) => v - sums[siteOf[i]!]! / counts[siteOf[i]!]!);
  };
  const yCentred = centre(y);
  const siteRows = siteNames.map((_, site) => y.flatMap((_, i) => (siteOf[i] === site ? [i] : [])));
  /** Least squares of y on site levels plus the given columns, by centring within sites. */
  const leastSquares = (columns: number[][]) => {
    const centred = columns.map(centre);
    const k = columns.length;
    const cross = new Matrix(
      centred.map((a) => centred.map((b) => a.reduce((sum, v, i) => sum + v * b[i]!, 0))),
    );
    const covariance = inverse(cross);
    const xty = centred.map((a) => a.reduce((sum, v, i) => sum + v * yCentred[i]!, 0));
    const slopes = Array.from({ length: k }, (_, r) =>
      xty.reduce((sum, v, c) => sum + covariance.get(r, c) * v, 0),
    );
    let rss = 0;
    for (let i = 0; i < n; i++) {
      let fitted = 0;
      for (let r = 0; r < k; r++) fitted += slopes[r]! * centred[r]![i]!;
      rss += (yCentred[i]! - fitted) ** 2;
    }
    // Site level = site mean of y − Σ slope · site mean of the column.
    const levels = siteRows.map((rows) => {
      const average = (values: readonly number[]) =>
        rows.reduce((sum, i) => sum + values[i]!, 0) / rows.length;
      return average(y) - columns.reduce((sum, column, r) => sum + slopes[r]! * average(column), 0);
    });
    if (!(rss >= 0) || !slopes.every(Number.isFinite))
      throw new Error('fitResponseModels: the curve columns are collinear');
    return { slopes, covariance, rss, p: s + k, meanIntercept: mean(levels) };
  };
  const aic = (rss: number, parameters: number) =>
    n * Math.log((2 * Math.PI * rss) / n) + n + 2 * (parameters + 1);
  const tQuantile = (df: number) => studentTQuantile(1 - alpha / 2, df);
  const interval = (value: number, se: number, df: number): OptimumInterval => {
    const half = tQuantile(df) * se;
    return {
      value,
      ciLow: value - half,
      ciHigh: value + half,
      beyondTestedRates: value < low || value > high,
    };
  };

  // Quadratic.
  const quadratic = leastSquares([x, x.map((v) => v * v)]);
  const qDf = n - quadratic.p;
  const qSigma2 = quadratic.rss / qDf;
  const b1 = quadratic.slopes[0]!;
  const b2 = quadratic.slopes[1]!;
  const v11 = quadratic.covariance.get(0, 0) * qSigma2;
  const v12 = quadratic.covariance.get(0, 1) * qSigma2;
  const v22 = quadratic.covariance.get(1, 1) * qSigma2;
  const quadraticOptimum = (slope: number): OptimumInterval | null => {
    if (!(b2 < 0)) return null;
    const value = (slope - b1) / (2 * b2);
    const g1 = -1 / (2 * b2);
    const g2 = -(slope - b1) / (2 * b2 * b2);
    return interval(value, Math.sqrt(g1 * g1 * v11 + 2 * g1 * g2 * v12 + g2 * g2 * v22), qDf);
  };
  const quadraticModel: ResponseModel = {
    model: 'quadratic',
    parameters: { linear: b1, quadratic: b2 },
    standardErrors: { linear: Math.sqrt(v11), quadratic: Math.sqrt(v22) },
    meanIntercept: quadratic.meanIntercept,
    residualSs: quadratic.rss,
    residualDf: qDf,
    aic: aic(quadratic.rss, quadratic.p),
    rSquaredWithinSites: 1 - quadratic.rss / withinSs,
    agronomicOptimum: quadraticOptimum(0),
  };

  // Plateau models: profile the join x0.
  const plateau = (
    kind: 'linear-plateau' | 'quadratic-plateau',
  ): { model: ResponseModel; optimumAt: (ratio: number) => OptimumInterval | null } => {
    const power = kind === 'linear-plateau' ? 1 : 2;
    const regressor = (x0: number) => x.map((v) => (Math.min(v, x0) - x0) ** power);
    // A join at the lowest rate leaves nothing to fit: those joins are never the answer.
    const rssAt = (x0: number) => {
      try {
        return leastSquares([regressor(x0)]).rss;
      } catch {
        return Infinity;
      }
    };
    let bestJoin = high;
    let bestRss = rssAt(high);
    // At least two tested rates must lie below the join, else slope and join are confounded.
    for (let k = 1; k + 1 < rates.length; k++) {
      const [join, value] = goldenSection(rssAt, rates[k]!, rates[k + 1]!);
      if (value < bestRss) [bestJoin, bestRss] = [join, value];
    }
    const fit = leastSquares([regressor(bestJoin)]);
    const slope = fit.slopes[0]!;
    const df = n - (fit.p + 1);
    const sigma2 = fit.rss / df;
    // Gauss–Newton covariance of (slope, join) with the site levels absorbed (centred columns).
    const slopeColumn = centre(x.map((v) => (Math.min(v, bestJoin) - bestJoin) ** power));
    const joinColumn = centre(
      x.map((v) => (v < bestJoin ? (power === 1 ? -slope : -2 * slope * (v - bestJoin)) : 0)),
    );
    const jacobian = [slopeColumn, joinColumn];
    // A join at the second lowest rate or at the highest one is not identified (no plateau,
    // or one rate below it): no standard errors and no optimum interval then.
    const spread = high - low;
    const identified = bestJoin > rates[1]! + 1e-6 * spread && bestJoin < high - 1e-6 * spread;
    let vSlope = Number.NaN;
    let vJoin = Number.NaN;
    let vBoth = Number.NaN;
    if (identified) {
      const covariance = inverse(
        new Matrix(
          jacobian.map((a) => jacobian.map((b) => a.reduce((sum, v, i) => sum + v * b[i]!, 0))),
        ),
      ).mul(sigma2);
      vSlope = covariance.get(0, 0);
      vJoin = covariance.get(1, 1);
      vBoth = covariance.get(0, 1);
    }
    const name = power === 1 ? 'slope' : 'curvature';
    const concave = (power === 1 ? slope > 0 : slope < 0) && identified;
    const optimum = (ratio: number): OptimumInterval | null => {
      if (!concave) return null;
      if (power === 1) return ratio < slope ? interval(bestJoin, Math.sqrt(vJoin), df) : null;
      // Slope 2c·(x − x0) = ratio → x = x0 + ratio/(2c).
      const value = bestJoin + ratio / (2 * slope);
      const gSlope = -ratio / (2 * slope * slope);
      return interval(value, Math.sqrt(vJoin + 2 * gSlope * vBoth + gSlope * gSlope * vSlope), df);
    };
    const model: ResponseModel = {
      model: kind,
      parameters: { [name]: slope, join: bestJoin },
      standardErrors: { [name]: Math.sqrt(vSlope), join: Math.sqrt(vJoin) },
      meanIntercept: fit.meanIntercept,
      residualSs: fit.rss,
      residualDf: df,
      aic: aic(fit.rss, fit.p + 1),
      rSquaredWithinSites: 1 - fit.rss / withinSs,
      agronomicOptimum: optimum(0),
    };
    return { model, optimumAt: optimum };
  };
  const fits = [
    { model: quadraticModel, optimumAt: quadraticOptimum },
    plateau('linear-plateau'),
    plateau('quadratic-plateau'),
  ];
  const models = fits.map(({ model, optimumAt }) =>
    priceRatio === undefined ? model : { ...model, economicOptimum: optimumAt(priceRatio) },
  );
  const chosen = models.reduce((best, model) => (model.aic < best.aic ? model : best)).model;
  const result: ResponseModels = {
    models,
    chosen,
    intervalMethod: 'delta method',
    points: n,
    sites: s,
    testedRange: { low, high },
  };
  if (priceRatio !== undefined) {
    result.priceRatio = priceRatio;
    result.economicTable = [0.5, 0.75, 1, 1.25, 1.5, 2].map((factor) => ({
      priceRatio: factor * priceRatio,
      optimum: fits.find((f) => f.model.model === chosen)!.optimumAt(factor * priceRatio),
    }));
  }
  return result;
}

function mean(values: readonly number[]): number {
  return values.reduce((a, b) => a + b, 0) / values.length;
}

/** Minimum of a unimodal-enough function on [a, b] by golden-section search (to 1e-12 relative). */
function goldenSection(f: (x: number) => number, a: number, b: number): [number, number] {
  const ratio = (Math.sqrt(5) - 1) / 2;
  let lo = a;
  let hi = b;
  let c = hi - ratio * (hi - lo);
  let d = lo + ratio * (hi - lo);
  let fc = f(c);
  let fd = f(d);
  for (let i = 0; i < 200 && hi - lo > 1e-12 * Math.max(1, Math.abs(hi)); i++) {
    if (fc < fd) {
      hi = d;
      d = c;
      fd = fc;
      c = hi - ratio * (hi - lo);
      fc = f(c);
    } else {
      lo = c;
      c = d;
      fc = fd;
      d = lo + ratio * (hi - lo);
      fd = f(d);
    }
  }
  const candidates: [number, number][] = [
    [a, f(a)],
    [b, f(b)],
    [(lo + hi) / 2, f((lo + hi) / 2)],
  ];
  return candidates.reduce((best, candidate) => (candidate[1] < best[1] ? candidate : best));
}
