// Chart colours keep one meaning across the report, the PDF and the meeting view, and the heat
// map lists strips in the field order the packet map uses.
import { describe, expect, it } from 'vitest';
import {
  DARK_CHART_THEME,
  LIGHT_CHART_THEME,
  responseCurveSpec,
  stripMapSpec,
  type ChartSpec,
} from '../../../shared/reports/chart-specs';
import { field, soil, straw } from '../../../shared/brand/colours';

// Common practice, no published source: an invented curve with both optima inside the range.
const curveInput = {
  points: [
    { site: 'A', seedRate: 30, mean: 40 },
    { site: 'A', seedRate: 120, mean: 55 },
  ],
  curve: { intercept: 20, linear: 0.6, quadratic: -0.002, testedRange: { low: 30, high: 120 } },
  agronomicOptimum: 150,
  economicOptimum: 110,
  seedUnit: 'lb/acre',
  yieldUnit: 'bu/acre',
};

interface Layer {
  mark?: { type: string; color?: string };
  layer?: { encoding: { color: { scale: { domain: string[]; range: string[] } } } }[];
}

function colours(spec: ChartSpec) {
  const layers = spec.layer as Layer[];
  const curve = layers.find((l) => l.mark?.type === 'line')!.mark!.color!;
  const optima = layers.at(-1)!.layer![0]!.encoding.color.scale;
  return { curve, optima };
}

/** Hue in degrees of a #rrggbb colour. */
function hue(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255) as [
    number,
    number,
    number,
  ];
  const max = Math.max(r, g, b);
  const min = Math.min(r, g, b);
  if (max === min) return 0;
  const d = max - min;
  const h = max === r ? ((g - b) / d) % 6 : max === g ? (b - r) / d + 2 : (r - g) / d + 4;
  return (h * 60 + 360) % 360;
}

describe('chart colours', () => {
  it('gives the curve and the two optima three different colours in each theme', () => {
    for (const theme of [LIGHT_CHART_THEME, DARK_CHART_THEME]) {
      const { curve, optima } = colours(responseCurveSpec(curveInput, { theme }));
      expect(new Set([curve, ...optima.range]).size).toBe(3);
    }
  });

  it('keeps each optimum in the same hue family in the report and the meeting view', () => {
    const light = colours(responseCurveSpec(curveInput, { theme: LIGHT_CHART_THEME })).optima;
    const dark = colours(responseCurveSpec(curveInput, { theme: DARK_CHART_THEME })).optima;
    expect(dark.domain).toEqual(light.domain);
    light.range.forEach((colour, i) => {
      const difference = Math.abs(hue(colour) - hue(dark.range[i]!));
      expect(Math.min(difference, 360 - difference)).toBeLessThan(30);
    });
  });
});

describe('stripMapSpec', () => {
  it('lists strips block by block, in sowing order, like the packet map', () => {
    const spec = stripMapSpec({
      strips: [
        { block: 2, position: 1, label: 'full', yield: 50 },
        { block: 1, position: 2, label: 'half', yield: 48 },
        { block: 1, position: 1, label: 'full', yield: 51 },
      ],
      yieldUnit: 'bu/acre',
    });
    const y = (spec.encoding as { y: { sort: string[] } }).y;
    expect(y.sort).toEqual(['Block 1 · strip 1', 'Block 1 · strip 2', 'Block 2 · strip 1']);
  });

  it('shades yield in brand colours, lighter for low yield and darker for high', () => {
    const spec = stripMapSpec({
      strips: [{ block: 1, position: 1, label: 'full', yield: 50 }],
      yieldUnit: 'bu/acre',
    });
    const rect = (spec.layer as { encoding: { color?: { scale?: { range?: string[] } } } }[])[0]!;
    const range = rect.encoding.color!.scale!.range!;
    const brand = new Set(
      [straw, field, soil].flatMap((scale) => Object.values(scale as Record<string, string>)),
    );
    for (const colour of range) expect(brand.has(colour), colour).toBe(true);
    // Relative luminance (sRGB weights, no gamma: enough to order the steps) falls along the ramp.
    const light = (hex: string) =>
      [1, 3, 5]
        .map((i) => parseInt(hex.slice(i, i + 2), 16))
        .reduce((sum, v, i) => sum + v * [0.2126, 0.7152, 0.0722][i]!, 0);
    range.slice(1).forEach((colour, i) => expect(light(colour)).toBeLessThan(light(range[i]!)));
  });
});
