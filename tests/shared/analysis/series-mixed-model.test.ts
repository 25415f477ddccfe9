import { describe, expect, it } from 'vitest';
import {
  analyzeSeries,
  fitNetworkMixedModel,
  fitSeriesMixedModel,
  type SeriesStripObservation,
} from '../../../shared/analysis/index';
import { readFixture } from '../helpers';

type Components = Record<
  | 'season'
  | 'seasonByRate'
  | 'siteSeason'
  | 'blockWithinSiteSeason'
  | 'siteSeasonByRate'
  | 'residual',
  number
>;
type Reference = {
  data: { season: string; site: string; block: string; rate: number; value: number }[];
  reference: string;
  varianceComponents: Components;
  singular: boolean;
  restrictedLogLikelihood: number;
  fixedEffects: number[];
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
  readFixture<Record<'balanced' | 'unbalanced' | 'missing', Reference>>('r-series-model.json');

const rowsOf = (ref: Reference): SeriesStripObservation[] =>
  ref.data.map((d) => ({
    season: d.season,
    site: d.site,
    block: d.block,
    rate: d.rate,
    value: d.value,
  }));
const levels = ['0.5', '1', '1.5', '2'];

function expectRelative(actual: number, expected: number, tolerance: number, floor = 1e-12): void {
  const scale = Math.max(Math.abs(expected), floor);
  expect(Math.abs(actual - expected) / scale, `${actual} vs ${expected}`).toBeLessThan(tolerance);
}

// balanced: 2 seasons × 5 sites × 4 blocks, season × rate on the boundary (0);
// unbalanced: 3 seasons with 4, 6 and 3 sites, 3–5 blocks, 7 strips missing, season at 0;
// missing: 2 seasons with 6 and 4 sites, 3 strips missing, every component positive.
describe.each(['balanced', 'unbalanced', 'missing'] as const)(
  'series mixed model on the %s data against lme4 + pbkrtest + emmeans',
  (name) => {
    const ref = reference[name];
    const analysis = analyzeSeries(rowsOf(ref), levels, '1');
    const pooled = analysis.pooled!;

    it('matches the REML variance components to 1e-4 and the fixed effects to 1e-6', () => {
      for (const [component, value] of Object.entries(ref.varianceComponents)) {
        const ours = pooled.varianceComponents[component as keyof Components];
        // Source: R 4.2.2, lme4 1.1.31 lmer(REML, tightly converged) (fixtures/reference/series-model.R);
        // lme4 stops a boundary component a hair above zero (≤ 1e-11 here), Sheaf sets it to 0.
        if (value < 1e-8) expect(ours).toBe(0);
        else expectRelative(ours, value, 1e-4);
      }
      const fit = fitSeriesMixedModel(rowsOf(ref), levels);
      // Source: R 4.2.2, lme4 1.1.31 fixef(fit) and logLik(fit) (REML)
      fit.coefficients.forEach((c, i) => expectRelative(c, ref.fixedEffects[i]!, 1e-6));
      expectRelative(fit.restrictedLogLikelihood, ref.restrictedLogLikelihood, 1e-9);
      expect(pooled.boundary.length > 0).toBe(ref.singular);
    });

    it('matches the Kenward–Roger rate test, means and differences', () => {
      // Source: R 4.2.2, pbkrtest 0.5.2 KRmodcomp(fit, L) (scaled F, ddf, p)
      expectRelative(pooled.rateTest.f, ref.rateTest.f, 1e-4);
      expect(pooled.rateTest.df1).toBe(ref.rateTest.df1);
      expectRelative(pooled.rateTest.df2, ref.rateTest.df2, 1e-4);
      expectRelative(pooled.rateTest.p, ref.rateTest.p, 1e-4);
      ref.means.forEach((r, i) => {
        const m = pooled.means[i]!;
        // Source: R 4.2.2, emmeans 1.8.4.1 emmeans(fit, ~rate, lmer.df = "kenward-roger")
        expectRelative(m.mean, r.mean, 1e-6);
        expectRelative(m.se, r.se, 1e-4);
        expectRelative(m.df, r.df, 1e-4);
        expectRelative(m.ciLow, r.ciLow, 1e-4);
        expectRelative(m.ciHigh, r.ciHigh, 1e-4);
      });
      ref.differences.forEach((r, i) => {
        const d = pooled.differences[i]!;
        expect(d.rate).toBe(String(r.rate));
        // Source: R 4.2.2, emmeans contrast(..., "trt.vs.ctrl", adjust = "none") with KR df
        // A difference near 0 is compared relative to its standard error.
        expectRelative(d.estimate, r.estimate, 1e-6, r.se);
        expectRelative(d.se, r.se, 1e-4);
        expectRelative(d.df, r.df, 1e-4);
        expectRelative(d.p, r.p, 1e-4);
        expectRelative(d.ciHigh, r.ciHigh, 1e-4);
        // Source: R 4.2.2, mvtnorm 1.1.3 (fixtures/reference/series-model.R). 1e-3 as point 2's
        // Dunnett tolerance: at KR df near 1 (the "missing" case) the multivariate t integral
        // is the least exact part (about 3e-4 relative there).
        expectRelative(d.pAdjusted, r.pAdjusted, 1e-3);
        expectRelative(d.ciLowAdjusted, r.ciLowAdjusted, 1e-3);
      });
    });
  },
);

describe('series analysis, structural checks', () => {
  it('sets each season beside the pool with its own network model and counts agreeing seasons', () => {
    const rows = rowsOf(reference.unbalanced);
    const analysis = analyzeSeries(rows, levels, '1');
    expect(analysis.seasons.map((s) => s.season)).toEqual(['2025', '2026', '2027']);
    const season = analysis.seasons[1]!;
    // Common practice, no published source: a season's own model is the network model of its strips.
    const own = fitNetworkMixedModel(
      rows.filter((r) => r.season === '2026'),
      levels,
    );
    expectRelative(season.mixed!.means[0]!.mean, own.coefficients[0]!, 1e-12);
    expect(season.sites).toBe(6);
    for (const perRate of analysis.consistency!.perRate) {
      expect(perRate.seasons).toBe(3);
      expect(perRate.asWell + perRate.worse + perRate.better).toBe(3);
    }
    const { seasonByRate, siteSeasonByRate, seasonShare } = analysis.consistency!;
    expectRelative(seasonShare!, seasonByRate / (seasonByRate + siteSeasonByRate), 1e-12);
  });

  it('gives the same fit whatever the row order', () => {
    const rows = rowsOf(reference.missing);
    const a = fitSeriesMixedModel(rows, levels);
    const b = fitSeriesMixedModel([...rows].reverse(), levels);
    expectRelative(b.varianceComponents.seasonByRate, a.varianceComponents.seasonByRate, 1e-9);
    b.coefficients.forEach((c, i) => expectRelative(c, a.coefficients[i]!, 1e-10));
  });

  it('refuses a series of one season with a note instead of a pooled model', () => {
    const rows = rowsOf(reference.balanced).filter((r) => r.season === '2026');
    const analysis = analyzeSeries(rows, levels, '1');
    expect(analysis.pooled).toBeNull();
    expect(analysis.notes[0]).toMatch(/at least 2 seasons/);
    expect(analysis.seasons[0]!.mixed).not.toBeNull();
  });
});
