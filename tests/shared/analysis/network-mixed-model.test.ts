import { describe, expect, it } from 'vitest';
import {
  analyzeNetworkMixedModel,
  analyzePooled,
  fitNetworkMixedModel,
  type StripObservation,
} from '../../../shared/analysis/index';
import { readFixture } from '../helpers';

type Reference = {
  data: { site: string; block: string; rate: number; value: number }[];
  reference: string | number;
  varianceComponents: Record<'site' | 'blockWithinSite' | 'siteByRate' | 'residual', number>;
  restrictedLogLikelihood: number;
  fixedEffects: number[];
  vcovAdj: number[][];
  rateTest: { f: number; df1: number; df2: number; p: number };
  means: { rate: number; mean: number; se: number; df: number; ciLow: number; ciHigh: number }[];
  differences: {
    rate: number;
    estimate: number;
    se: number;
    df: number;
    ciLow: number;
    ciHigh: number;
    p: number;
    pAdjusted: number;
    ciLowAdjusted: number;
    ciHighAdjusted: number;
  }[];
};
const reference =
  readFixture<Record<'balanced' | 'unbalanced' | 'gomez', Reference>>('r-mixed-model.json');

const rowsOf = (ref: Reference): StripObservation[] =>
  ref.data.map((d) => ({ site: d.site, block: d.block, rate: d.rate, value: d.value }));
const levelsOf = (ref: Reference) =>
  [...new Set(ref.data.map((d) => d.rate))].sort((a, b) => a - b).map(String);

function expectRelative(actual: number, expected: number, tolerance: number): void {
  const scale = Math.max(Math.abs(expected), 1e-12);
  expect(Math.abs(actual - expected) / scale, `${actual} vs ${expected}`).toBeLessThan(tolerance);
}

describe.each(['balanced', 'unbalanced', 'gomez'] as const)(
  'network mixed model on the %s data against lme4 + pbkrtest + emmeans',
  (name) => {
    const ref = reference[name];
    const analysis = analyzeNetworkMixedModel(rowsOf(ref), levelsOf(ref), String(ref.reference));

    it('matches the REML variance components to 1e-4 relative', () => {
      for (const [component, value] of Object.entries(ref.varianceComponents)) {
        const ours = analysis.varianceComponents[component as keyof typeof ref.varianceComponents];
        // Source: R 4.2.2, lme4 1.1.31 lmer(REML, tightly converged) (fixtures/reference/mixed-model.R)
        if (value === 0) expect(ours).toBeLessThan(1e-8);
        else expectRelative(ours, value, 1e-4);
      }
    });

    it('matches the rate means to 1e-6 and their KR SE, df and CI to 1e-4', () => {
      ref.means.forEach((r, i) => {
        const m = analysis.means[i]!;
        expect(m.rate).toBe(String(r.rate));
        // Source: R 4.2.2, emmeans 1.8.4.1 emmeans(fit, ~rate, lmer.df = "kenward-roger")
        expectRelative(m.mean, r.mean, 1e-6);
        expectRelative(m.se, r.se, 1e-4);
        expectRelative(m.df, r.df, 1e-4);
        expectRelative(m.ciLow, r.ciLow, 1e-4);
        expectRelative(m.ciHigh, r.ciHigh, 1e-4);
      });
    });

    it('matches the Kenward–Roger rate test to 1e-4', () => {
      // Source: R 4.2.2, pbkrtest 0.5.2 KRmodcomp(fit, L) (scaled F, ddf, p)
      expectRelative(analysis.rateTest.f, ref.rateTest.f, 1e-4);
      expect(analysis.rateTest.df1).toBe(ref.rateTest.df1);
      expectRelative(analysis.rateTest.df2, ref.rateTest.df2, 1e-4);
      expectRelative(analysis.rateTest.p, ref.rateTest.p, 1e-4);
      expect(analysis.rateTest.ddf).toBe('kenward-roger');
    });

    it('matches unadjusted and Dunnett-adjusted differences from the reference rate', () => {
      ref.differences.forEach((r, i) => {
        const d = analysis.differences[i]!;
        expect(d.rate).toBe(String(r.rate));
        // Source: R 4.2.2, emmeans contrast(..., "trt.vs.ctrl", adjust = "none") with KR df
        expectRelative(d.estimate, r.estimate, 1e-6);
        expectRelative(d.se, r.se, 1e-4);
        expectRelative(d.df, r.df, 1e-4);
        expectRelative(d.p, r.p, 1e-4);
        expectRelative(d.ciLow, r.ciLow, 1e-4);
        // Source: R 4.2.2, mvtnorm 1.1.3 Miwa box probability integrated over the chi scale
        // with each contrast's unrounded KR df (fixtures/reference/mixed-model.R)
        expectRelative(d.pAdjusted, r.pAdjusted, 1e-4);
        expectRelative(d.ciLowAdjusted, r.ciLowAdjusted, 1e-4);
        expectRelative(d.ciHighAdjusted, r.ciHighAdjusted, 1e-4);
        expect(d.pAdjusted).toBeGreaterThanOrEqual(d.p);
      });
    });
  },
);

describe('network mixed model, published and structural checks', () => {
  it('reproduces the combined-ANOVA rate F of the Gomez & Gomez two-season example', () => {
    const gomez = reference.gomez;
    const pooled = analyzePooled(rowsOf(gomez), { reference: '0' });
    const classical = pooled.anova.find((row) => row.source === 'rate') as { f: number };
    // Source: Gomez & Gomez (1984), Statistical Procedures for Agricultural Research, ch. 8.1,
    // Table 8.4 (nitrogen tested against season × nitrogen; R 4.2.2 gives F = 1.9416 on 4 and 4 df)
    expect(pooled.mixed!.rateTest.f).toBeCloseTo(1.9416, 4);
    // Common practice, no published source: balanced data, positive site × rate variance →
    // the Kenward–Roger F equals the classical F against site × rate.
    expectRelative(pooled.mixed!.rateTest.f, classical.f, 1e-8);
    expectRelative(pooled.mixed!.rateTest.df2, 4, 1e-8);
  });

  it('uses every strip of unbalanced sites instead of falling back to site means', () => {
    const pooled = analyzePooled(rowsOf(reference.unbalanced), { reference: '1' });
    expect(pooled.method).toBe('site-means');
    expect(pooled.mixed!.observations).toBe(reference.unbalanced.data.length);
  });

  it('gives the same fit whatever the row order', () => {
    const rows = rowsOf(reference.unbalanced);
    const a = fitNetworkMixedModel(rows);
    const b = fitNetworkMixedModel([...rows].reverse());
    expectRelative(b.varianceComponents.siteByRate, a.varianceComponents.siteByRate, 1e-9);
    b.coefficients.forEach((c, i) => expectRelative(c, a.coefficients[i]!, 1e-10));
  });
});
