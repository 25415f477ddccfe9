// The chart specs compile with Vega-Lite and carry the data and the app font.
import { describe, expect, it } from 'vitest';
import { compile, type TopLevelSpec } from 'vega-lite';
import {
  componentsSpec,
  DARK_CHART_THEME,
  forestSpec,
  rateMeansSpec,
  responseCurveSpec,
  stripMapSpec,
  type ChartSpec,
} from '../../../shared/reports/chart-specs';
import { designUnits } from '../../../shared/units/design-units';

const compiles = (spec: ChartSpec) => {
  const out = compile(spec as unknown as TopLevelSpec);
  expect(out.spec).toBeTruthy();
  return out.spec;
};

describe('chart specs', () => {
  const means = [
    { label: 'half', mean: 50, ciLow: 47, ciHigh: 53 },
    { label: 'full', mean: 54, ciLow: 51, ciHigh: 57 },
  ];
  it('draws rate means with CI bars and the strips as points', () => {
    const spec = rateMeansSpec({
      means,
      strips: [
        { label: 'half', yield: 49, block: 1 },
        { label: 'full', yield: null, block: 1 },
      ],
      yieldUnit: 'bu/acre',
    });
    compiles(spec);
    expect((spec.config as { font: string }).font).toMatch(/Inter/);
    // Vega names the drawn chart after its description (the SVG's aria-label).
    expect(compiles(spec).description).toBe(
      'Mean yield (bu/acre) at each seeding rate with its 95 % confidence interval; open points are the single strips.',
    );
    expect(
      rateMeansSpec({ means, strips: [], yieldUnit: 'bu/acre' }, { description: 'Own words.' })
        .description,
    ).toBe('Own words.');
    const layers = spec.layer as { data: { values: unknown[] } }[];
    expect(layers[0]!.data.values).toHaveLength(1);
    expect(layers[1]!.data.values).toEqual(means);
  });
  it('gives a t/ha yield two decimals in the tooltips, bu/acre one', () => {
    // Common practice, no published source: t/ha to two decimals (4.52), bu/acre to one (62.4).
    const formats = (yieldUnit: string) =>
      JSON.stringify(rateMeansSpec({ means, strips: [], yieldUnit })).match(/"format":"[^"]+"/g);
    expect(new Set(formats('t/ha'))).toEqual(new Set(['"format":".2f"']));
    expect(new Set(formats('bu/acre'))).toEqual(new Set(['"format":".1f"']));
    const map = stripMapSpec({
      strips: [{ block: 1, position: 1, label: 'full', yield: 4.52 }],
      yieldUnit: 't/ha',
    });
    expect(JSON.stringify(map)).toContain('"title":"Yield (t/ha)","format":".2f"');
  });
  it('compiles the components, strip map, forest plot and response curve, light and dark', () => {
    compiles(
      componentsSpec({
        rows: [
          { label: 'half', plantsPerSquareFoot: 12, tillersPerPlant: 2.1, headsPerSquareFoot: 30 },
        ],
      }),
    );
    const metricParts = componentsSpec({
      rows: [
        { label: 'half', plantsPerSquareFoot: 20, tillersPerPlant: 2, headsPerSquareFoot: 30 },
      ],
      perArea: designUnits('metric').perArea,
    });
    const partValues = (metricParts.data as { values: { measure: string; value: number }[] })
      .values;
    // Source: NIST SP 811 (2008), Appendix B.8: 1 ft² = 0.092 903 04 m²; 20/ft² = 215.3/m².
    expect(partValues.find((v) => v.measure === 'Plants per m²')!.value).toBeCloseTo(215.28, 2);
    expect(partValues.find((v) => v.measure === 'Tillers per plant')!.value).toBe(2);
    compiles(metricParts);
    compiles(
      stripMapSpec(
        {
          strips: [
            { block: 1, position: 1, label: 'half', yield: 50 },
            { block: 1, position: 2, label: 'full', yield: null },
          ],
          yieldUnit: 'bu/acre',
        },
        { theme: DARK_CHART_THEME },
      ),
    );
    const forest = forestSpec({
      rateLabel: 'half',
      referenceLabel: 'full',
      yieldUnit: 'bu/acre',
      sites: [{ site: 'A', diff: -1, ciLow: -3, ciHigh: 1 }],
      pooled: { diff: -0.5, ciLow: -2, ciHigh: 1 },
    });
    compiles(forest);
    expect(forest.description).toMatch(/^Difference in yield from the reference rate/);
    expect(JSON.stringify(forest)).toContain('All sites (pooled)');
    const curve = responseCurveSpec(
      {
        points: [{ site: 'A', seedRate: 50, mean: 40 }],
        curve: {
          intercept: 20,
          linear: 0.5,
          quadratic: -0.002,
          testedRange: { low: 20, high: 160 },
        },
        agronomicOptimum: 125,
        economicOptimum: 110,
        seedUnit: 'lb/acre',
        yieldUnit: 'bu/acre',
      },
      { scale: 1.6 },
    );
    compiles(curve);
    const line = (curve.layer as { data: { values: { seedRate: number; fitted: number }[] } }[])[1]!
      .data.values;
    expect(line[0]).toEqual({ seedRate: 20, fitted: 20 + 0.5 * 20 - 0.002 * 400 });
  });
});
