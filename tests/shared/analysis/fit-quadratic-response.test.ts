import { describe, expect, it } from 'vitest';
import { fitQuadraticResponse } from '../../../shared/analysis/index';
import { expectFigures, readFixture, type GomezSeedRate } from '../helpers';

const gomez = readFixture<GomezSeedRate>('gomez-rcbd-seeding-rate.json');
const points = gomez.data.map((d) => ({ rate: Number(d.rate), value: d.value }));

describe('fitQuadraticResponse', () => {
  const reference = gomez.quadraticPlotLevel;
  const curve = fitQuadraticResponse(points, {
    seedPricePerRateUnit: reference.economic.seed_price_usd_per_kg_seed,
    grainPricePerYieldUnit: reference.economic.grain_price_usd_per_kg_grain,
    rateUnit: 'kg seed/ha',
    yieldUnit: 'kg grain/ha',
  });

  it('matches R’s coefficients, standard errors and R²', () => {
    const [b0, b1, b2] = reference.coefficients;
    // Source: R 4.2.2 lm(yield ~ rate + I(rate^2)) on Gomez & Gomez (1984) p. 26 plots
    expectFigures(curve.intercept, b0!.estimate, 9);
    expectFigures(curve.linear, b1!.estimate, 8);
    expectFigures(curve.quadratic, b2!.estimate, 8);
    expectFigures(curve.standardErrors.intercept, b0!.se, 8);
    expectFigures(curve.standardErrors.linear, b1!.se, 8);
    expectFigures(curve.standardErrors.quadratic, b2!.se, 8);
    expectFigures(curve.rSquared, reference.rSquared, 8);
  });

  it('reports the agronomic optimum inside the tested rates', () => {
    // Source: R 4.2.2 −b1/(2·b2) = 29.148; agridat gomez.seedrate example: "Optimum is at 29"
    expectFigures(curve.agronomicOptimum!, reference.rateMaxYield, 8);
    expect(curve.agronomicOptimumFlag).toBeUndefined();
  });

  it('does not extrapolate an economic optimum below the tested rates', () => {
    // Source: R 4.2.2 (price ratio 3.2 kg grain per kg seed): x = −15.65, outside 25–150
    expect(reference.economic.rate_economic_optimum).toBeLessThan(25);
    expect(curve.economicOptimum).toBeNull();
    expect(curve.economicOptimumFlag).toBe('beyond the tested rates');
    expect(curve.economics?.rateUnit).toBe('kg seed/ha');
    expectFigures(curve.economics!.priceRatio, 3.2, 12);
  });

  it('finds an economic optimum below the agronomic one on a concave curve', () => {
    // y = 40 + 20x − 5x² exactly: agronomic optimum 2; with price ratio 4, (4 − 20)/(−10) = 1.6
    const exact = [0.5, 1, 1.5, 2, 2.5, 3].map((x) => ({
      rate: x,
      value: 40 + 20 * x - 5 * x * x,
    }));
    const fitted = fitQuadraticResponse(
      [...exact, { rate: 1, value: 55.1 }, { rate: 1, value: 54.9 }],
      {
        seedPricePerRateUnit: 8,
        grainPricePerYieldUnit: 2,
        rateUnit: 'x',
        yieldUnit: 'bu/ac',
      },
    );
    expectFigures(fitted.agronomicOptimum!, 2, 9);
    expectFigures(fitted.economicOptimum!, 1.6, 9);
  });

  it('refuses fewer than three rates', () => {
    expect(() =>
      fitQuadraticResponse([
        { rate: 1, value: 2 },
        { rate: 2, value: 3 },
        { rate: 1, value: 2.5 },
        { rate: 2, value: 3.2 },
      ]),
    ).toThrow(/fitQuadraticResponse needs at least 4 points at 3 or more rates/);
  });
});
