import { describe, expect, it } from 'vitest';
import { fitResponseModels } from '../../../shared/analysis/index';
import { readFixture } from '../helpers';

type Fit = {
  estimates: Record<string, number>;
  se: Record<string, number>;
  rss: number;
  df: number;
  aic: number;
};
const reference = readFixture<{
  points: { site: string; rate: number; value: number }[];
  quadratic: Fit;
  quadraticOptimum: { estimate: number; se: number };
  linearPlateau: Fit;
  quadraticPlateau: Fit;
}>('r-response-models.json');

function expectRelative(actual: number, expected: number, tolerance: number): void {
  expect(Math.abs(actual - expected) / Math.abs(expected), `${actual} vs ${expected}`).toBeLessThan(
    tolerance,
  );
}

describe('fitResponseModels against R lm and nls (site effects removed)', () => {
  const result = fitResponseModels(reference.points, 0.4);
  const model = (name: string) => result.models.find((m) => m.model === name)!;

  it('matches the quadratic of lm(value ~ 0 + site + rate + I(rate^2)) to 1e-4', () => {
    const quadratic = model('quadratic');
    const r = reference.quadratic;
    // Source: R 4.2.2 lm on the site × rate means (fixtures/reference/response-models.R)
    expectRelative(quadratic.parameters.linear!, r.estimates.rate!, 1e-4);
    expectRelative(quadratic.parameters.quadratic!, r.estimates['I(rate^2)']!, 1e-4);
    expectRelative(quadratic.standardErrors.linear!, r.se.rate!, 1e-4);
    expectRelative(quadratic.residualSs, r.rss, 1e-4);
    expect(quadratic.residualDf).toBe(r.df);
    expectRelative(quadratic.aic, r.aic, 1e-4);
    // Source: R 4.2.2 car 3.1.1 deltaMethod(fit, "-b1/(2*b2)")
    const optimum = quadratic.agronomicOptimum!;
    expectRelative(optimum.value, reference.quadraticOptimum.estimate, 1e-4);
    const half = optimum.ciHigh - optimum.value;
    // Source: as above; the interval is estimate ± t(0.975, residual df)·SE
    expect(half).toBeGreaterThan(reference.quadraticOptimum.se * 2);
    expect(half).toBeLessThan(reference.quadraticOptimum.se * 2.1);
  });

  it.each([
    ['linear-plateau', 'linearPlateau', 'slope'],
    ['quadratic-plateau', 'quadraticPlateau', 'curvature'],
  ] as const)('matches nls for the %s model to 1e-4', (name, key, parameter) => {
    const fit = model(name);
    const r = reference[key];
    // Source: R 4.2.2 nls(value ~ P[site] + b * (pmin(rate, x0) - x0)^power) from the profiled join
    expectRelative(fit.parameters[parameter]!, r.estimates.b!, 1e-4);
    expectRelative(fit.parameters.join!, r.estimates.x0!, 1e-4);
    expectRelative(fit.standardErrors.join!, r.se.x0!, 1e-4);
    expectRelative(fit.standardErrors[parameter]!, r.se.b!, 1e-4);
    expectRelative(fit.residualSs, r.rss, 1e-4);
    expectRelative(fit.aic, r.aic, 1e-4);
  });

  it('picks the smallest AIC and gives an economic optimum table across price ratios', () => {
    const smallest = [...result.models].sort((a, b) => a.aic - b.aic)[0]!;
    expect(result.chosen).toBe(smallest.model);
    expect(result.intervalMethod).toBe('delta method');
    expect(result.economicTable!.map((row) => row.priceRatio)).toEqual([
      0.2, 0.30000000000000004, 0.4, 0.5, 0.6000000000000001, 0.8,
    ]);
    // Common practice, no published source: dearer seed never raises the economic optimum.
    const values = result.economicTable!.map((row) => row.optimum?.value ?? Number.NaN);
    for (let i = 1; i < values.length; i++) expect(values[i]!).toBeLessThanOrEqual(values[i - 1]!);
    // R² within sites is a share of the within-site variation.
    for (const m of result.models) {
      expect(m.rSquaredWithinSites).toBeGreaterThan(0);
      expect(m.rSquaredWithinSites).toBeLessThan(1);
    }
  });
});
