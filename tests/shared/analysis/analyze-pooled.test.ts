import { describe, expect, it } from 'vitest';
import {
  analyzePooled,
  analyzeTrial,
  type AnovaRow,
  type PooledAnalysis,
} from '../../../shared/analysis/index';
import { expectFigures, readFixture, type GomezSeasons } from '../helpers';

const seasons = readFixture<GomezSeasons>('gomez-combined-two-seasons.json');
const names: Record<string, string> = {
  site: 'site',
  block_within_site: 'block(site)',
  treatment: 'rate',
  site_x_treatment: 'site:rate',
  pooled_error: 'error',
  total: 'total',
};
const row = (pooled: PooledAnalysis, source: string) =>
  pooled.anova.find((entry) => entry.source === source) as AnovaRow & {
    ms: number;
    f: number;
    p: number;
  };

describe('analyzePooled on the Gomez & Gomez two-season example', () => {
  const pooled = analyzePooled(seasons.data, { reference: '0' });

  it('matches R’s combined ANOVA with rate tested against site:rate', () => {
    expect(pooled.method).toBe('combined');
    for (const expected of seasons.r.anova) {
      const actual = row(pooled, names[expected.source]!);
      // Source: R 4.2.2 lm(y ~ site + site:block + rate + site:rate), Gomez & Gomez (1984) p. 318 data
      expect(actual.df).toBe(expected.df);
      expectFigures(actual.ss, expected.ss, 8);
      if (expected.F != null) expectFigures(actual.f, expected.F, 8);
      if (expected.p != null) expectFigures(actual.p, expected.p, 6);
    }
    // Source: R 4.2.2 treatment F against site × treatment = 1.9416, p = 0.2681
    expect(pooled.rateTest.errorTerm).toBe('site:rate');
    expect([pooled.rateTest.df1, pooled.rateTest.df2]).toEqual([4, 4]);
    expectFigures(pooled.rateTest.f, 1.94157269167642, 8);
  });

  it('matches R’s rate means over sites with SE and CI from site:rate', () => {
    for (const expected of seasons.r.means) {
      const actual = pooled.means.find((m) => m.rate === expected.treatment)!;
      // Source: R 4.2.2, se = sqrt(MS site:rate / (s·r)), t on 4 df
      expectFigures(actual.mean, expected.mean, 10);
      expectFigures(actual.se, seasons.r.seMean, 8);
      expectFigures(actual.ciLow, expected.lower, 7);
      expectFigures(actual.ciHigh, expected.upper, 7);
    }
  });

  it('matches R’s Bartlett test of the season error variances', () => {
    // Source: R 4.2.2 bartlett.test; chi-square 0.6168, df 1, p 0.4322
    expectFigures(pooled.bartlett!.chiSquare, seasons.r.bartlett.chi_square, 8);
    expect(pooled.bartlett!.df).toBe(seasons.r.bartlett.df);
    expectFigures(pooled.bartlett!.p, seasons.r.bartlett.p, 6);
  });

  it('lists each site’s difference from the reference with R’s SED', () => {
    const dry = pooled.siteDifferences.filter((d) => d.site === 'dry');
    expect(dry.map((d) => d.rate)).toEqual(['60', '90', '120', '150']);
    for (const difference of dry) {
      const pair = seasons.r.perSiteDryPairwise.find(
        (p) => p.level_a === difference.rate && p.level_b === '0',
      )!;
      // Source: R 4.2.2 per-season RCBD pairwise comparisons (dry season)
      expectFigures(difference.diff, pair.diff_a_minus_b, 10);
      expectFigures(difference.se, pair.sed, 8);
      expectFigures(difference.p, pair.p_lsd_unadjusted, 6);
    }
  });

  it('reproduces the published Table 8.4 sums of squares with the book’s 6.636', () => {
    const variant = seasons.publishedTable8_4Variant;
    const { site, rate, block, value } = variant.changedCell;
    const data = seasons.data.map((d) =>
      d.site === site && d.rate === rate && d.block === block ? { ...d, value } : d,
    );
    const result = analyzePooled(data);
    // Source: Gomez & Gomez (1984), Table 8.4 (6 decimals as printed)
    expect(row(result, 'site').ss).toBeCloseTo(variant.seasonSs, 5);
    expect(row(result, 'block(site)').ss).toBeCloseTo(variant.repsWithinSeasonSs, 5);
    expect(row(result, 'rate').ss).toBeCloseTo(variant.nitrogenSs, 5);
    expect(row(result, 'site:rate').ss).toBeCloseTo(variant.seasonByNitrogenSs, 5);
    expect(row(result, 'error').ss).toBeCloseTo(variant.pooledErrorSs, 5);
    expect(Number(row(result, 'site:rate').f.toFixed(2))).toBe(variant.seasonByNitrogenF);
    // The book treats seasons as fixed: nitrogen MS over pooled error MS
    expect(Number((row(result, 'rate').ms / row(result, 'error').ms).toFixed(2))).toBe(
      variant.nitrogenFvsPooledError,
    );
  });

  it('falls back to site means when a strip is missing, and says so', () => {
    const data = seasons.data.map((d) =>
      d.site === 'wet' && d.rate === '90' && d.block === 'R2' ? { ...d, value: null } : d,
    );
    const result = analyzeTrial(data, { reference: '0' });
    const pooled = result.pooled!;
    expect(pooled.method).toBe('site-means');
    expect(pooled.notes.join(' ')).toMatch(/site means|rate means/);
    expect(pooled.anova.map((r) => r.source)).toEqual(['site', 'rate', 'site:rate', 'total']);
    // Rate means over sites are averages of the sites' least-squares means
    for (const mean of pooled.means) {
      const siteMeans = result.sites.map((s) => s.means.find((m) => m.rate === mean.rate)!.mean);
      expectFigures(mean.mean, (siteMeans[0]! + siteMeans[1]!) / 2, 12);
    }
    // Site-means analysis: site:rate SS is the interaction of the 2 × 5 table of means
    const table = result.sites.map((s) => s.means.map((m) => m.mean));
    const grand = table.flat().reduce((a, b) => a + b, 0) / 10;
    let interaction = 0;
    table.forEach((means, k) =>
      means.forEach((value, i) => {
        const siteMean = means.reduce((a, b) => a + b, 0) / 5;
        const rateMean = (table[0]![i]! + table[1]![i]!) / 2;
        interaction += (value - siteMean - rateMean + grand) ** 2;
        void k;
      }),
    );
    expectFigures(row(pooled, 'site:rate').ss, interaction, 10);
  });

  it('fits the quadratic to site × rate means and flags a non-concave curve', () => {
    expect(pooled.curve?.model).toBe('quadratic');
    expect(pooled.curve?.points).toBe(10);
    const convex = seasons.data.map((d) => ({
      ...d,
      value: d.value + 0.001 * Number(d.rate) ** 2,
    }));
    const curve = analyzePooled(convex).curve!;
    expect(curve.quadratic).toBeGreaterThan(0);
    expect(curve.agronomicOptimum).toBeNull();
    expect(curve.agronomicOptimumFlag).toBe('curve not concave');
  });

  it('refuses a single site', () => {
    expect(() => analyzePooled(seasons.data.filter((d) => d.site === 'dry'))).toThrow(
      /at least 2 sites/,
    );
  });
});
