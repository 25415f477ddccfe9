import { describe, expect, it } from 'vitest';
import { analyzeSite, type AnovaRow, type SiteAnalysis } from '../../../shared/analysis/index';
import { expectFigures, readFixture, type GomezSeedRate } from '../helpers';

const gomez = readFixture<GomezSeedRate>('gomez-rcbd-seeding-rate.json');
type OutlierRow = { block: string; rate: string; rstudent: number; p: number; pBonferroni: number };
type DunnettRow = {
  contrast: string;
  estimate: number;
  se: number;
  pAdjusted: number;
  ciLowAdjusted: number;
  criticalValue: number;
};
const siteChecks = readFixture<{
  outlierSpiked: OutlierRow[];
  outlierClean: OutlierRow[];
  dunnettBalanced: DunnettRow[];
  dunnettMissing: DunnettRow[];
}>('r-site-checks.json');
const row = (analysis: SiteAnalysis, source: string) =>
  analysis.anova.find((entry) => entry.source === source) as AnovaRow & {
    ms: number;
    f: number;
    p: number;
  };

describe('analyzeSite on the Gomez & Gomez seeding-rate RCBD', () => {
  const analysis = analyzeSite(gomez.data, { reference: '100' });

  it('reproduces the published ANOVA (rounded as printed)', () => {
    const table = gomez.publishedTable2_6;
    // Source: Gomez & Gomez (1984), Table 2.6, p. 28
    expect(Math.round(row(analysis, 'block').ss)).toBe(table.blockSs);
    expect(Math.round(row(analysis, 'block').ms)).toBe(table.blockMs);
    expect(Math.round(row(analysis, 'rate').ss)).toBe(table.rateSs);
    expect(Math.round(row(analysis, 'rate').ms)).toBe(table.rateMs);
    expect(Number(row(analysis, 'rate').f.toFixed(2))).toBe(table.rateF);
    expect(Math.round(row(analysis, 'error').ss)).toBe(table.errorSs);
    expect(Math.round(row(analysis, 'error').ms)).toBe(table.errorMs);
    expect(Math.round(row(analysis, 'total').ss)).toBe(table.totalSs);
    expect(Number(analysis.cvPercent.toFixed(1))).toBe(table.cvPercent);
    expect(Math.round(analysis.grandMean)).toBe(table.grandMean);
  });

  it('matches R’s ANOVA, F and p to 8 significant figures', () => {
    for (const expected of gomez.r.anova) {
      const source = expected.source === 'treatment' ? 'rate' : expected.source;
      const actual = row(analysis, source);
      // Source: R 4.2.2 anova(lm(y ~ block + rate)) on Gomez & Gomez (1984) p. 26 data
      expect(actual.df).toBe(expected.df);
      expectFigures(actual.ss, expected.ss, 8);
      if (expected.F != null) expectFigures(actual.f, expected.F, 8);
      if (expected.p != null) expectFigures(actual.p, expected.p, 6);
    }
  });

  it('matches R’s grand mean, CV, SE, SED, LSD and HSD', () => {
    // Source: R 4.2.2 (mean, sqrt(MSE)/mean, sqrt(MSE/r), sqrt(2*MSE/r), qt(0.975, 15)*SED, qtukey(0.95, 6, 15)*sqrt(MSE/r))
    expectFigures(analysis.grandMean, gomez.r.grandMean, 10);
    expectFigures(analysis.cvPercent, gomez.r.cvPercent, 8);
    expectFigures(analysis.sed, gomez.r.sed, 8);
    expectFigures(analysis.lsd, gomez.r.lsd, 7);
    // qtukey is accurate to ~4 decimals: HSD to 5 significant figures
    expectFigures(analysis.hsd as number, gomez.r.hsd, 5);
  });

  it('matches R’s rate means, SE and 95 % CI', () => {
    for (const expected of gomez.r.means) {
      const mean = analysis.means.find((m) => m.rate === expected.treatment);
      // Source: R 4.2.2 emmeans / confint on Gomez & Gomez (1984) p. 26 data
      expect(mean?.n).toBe(expected.n);
      expectFigures(mean!.mean, expected.mean, 10);
      expectFigures(mean!.se, expected.se_mean_pooled, 8);
      expectFigures(mean!.ciLow, expected.ci95_lower_pooled, 7);
      expectFigures(mean!.ciHigh, expected.ci95_upper_pooled, 7);
    }
  });

  it('matches R’s unadjusted t-test p for each difference from the reference', () => {
    for (const difference of analysis.differences) {
      const pair = gomez.r.pairwise.find(
        (p) =>
          (p.level_a === difference.rate && p.level_b === '100') ||
          (p.level_b === difference.rate && p.level_a === '100'),
      )!;
      const sign = pair.level_a === difference.rate ? 1 : -1;
      // Source: R 4.2.2 pairwise t on the RCBD error (p_lsd_unadjusted)
      expectFigures(difference.diff, sign * pair.diff_a_minus_b, 10);
      expectFigures(difference.p, pair.p_lsd_unadjusted, 6);
      expectFigures(difference.ciHigh - difference.diff, gomez.r.lsd, 7);
    }
  });

  it('gives letters consistent with R’s Tukey significance flags (none significant: all "a")', () => {
    // Source: R 4.2.2 TukeyHSD: no pair differs at 0.05
    expect(gomez.r.pairwise.some((p) => p['significant_tukey_0.05'])).toBe(false);
    expect(analysis.means.every((m) => m.group === 'a')).toBe(true);
  });

  it('uses "1" as reference when present, else the most-observed middle rate', () => {
    expect(analyzeSite(gomez.data).reference).toBe('75');
    const multipliers = gomez.data
      .filter((d) => ['25', '50', '100', '150'].includes(d.rate))
      .map((d) => ({
        ...d,
        rate: { '25': 0.25, '50': 0.5, '100': 1, '150': 2 }[d.rate] as number,
      }));
    const result = analyzeSite(multipliers);
    expect(result.reference).toBe('1');
    expect(result.means.map((m) => m.rate)).toEqual(['0.25', '0.5', '1', '2']);
  });
});

describe('analyzeSite with a missing strip', () => {
  const blocks = ['R1', 'R2', 'R3', 'R4'];
  const rates = ['25', '50', '75', '100', '125', '150'];
  const rows = gomez.data.map((d) =>
    d.block === 'R2' && d.rate === '75' ? { ...d, value: null } : d,
  );
  const analysis = analyzeSite(rows, { reference: '100' });
  const observed = gomez.data.filter((d) => !(d.block === 'R2' && d.rate === '75'));
  const blockTotal = observed.filter((d) => d.block === 'R2').reduce((s, d) => s + d.value, 0);
  const rateTotal = observed.filter((d) => d.rate === '75').reduce((s, d) => s + d.value, 0);
  const grandTotal = observed.reduce((s, d) => s + d.value, 0);
  // Classic missing-plot estimate by hand: (rB + tT − G)/((r − 1)(t − 1)), Gomez & Gomez (1984) sec. 7.1.2.1
  const classic = (4 * blockTotal + 6 * rateTotal - grandTotal) / (3 * 5);
  const filled = gomez.data.map((d) =>
    d.block === 'R2' && d.rate === '75' ? { ...d, value: classic } : d,
  );
  const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length;

  it('reports the classic estimate and the equal least-squares fitted value', () => {
    expect(analysis.missing).toBe(1);
    expect(analysis.method).toBe('least-squares');
    expectFigures(analysis.missingEstimates[0]!.estimate, classic, 10);
    expectFigures(analysis.missingEstimates[0]!.classicEstimate!, classic, 12);
  });

  it('gives least-squares means equal to the means after filling in the estimate', () => {
    for (const rate of rates) {
      const expected = mean(filled.filter((d) => d.rate === rate).map((d) => d.value));
      expectFigures(analysis.means.find((m) => m.rate === rate)!.mean, expected, 10);
    }
    expect(analysis.means.find((m) => m.rate === '75')!.n).toBe(3);
  });

  it('adjusts the rate SS as the missing-plot method with the bias correction, and drops one error df', () => {
    const grand = mean(filled.map((d) => d.value));
    const rateSsFilled = rates.reduce(
      (s, rate) =>
        s + 4 * (mean(filled.filter((d) => d.rate === rate).map((d) => d.value)) - grand) ** 2,
      0,
    );
    const blockSsFilled = blocks.reduce(
      (s, block) =>
        s + 6 * (mean(filled.filter((d) => d.block === block).map((d) => d.value)) - grand) ** 2,
      0,
    );
    const totalSsFilled = filled.reduce((s, d) => s + (d.value - grand) ** 2, 0);
    // Bias = [B − (t − 1)·ŷ]² / [t(t − 1)], Gomez & Gomez (1984) sec. 7.1.2.1 (Yates 1933)
    const bias = (blockTotal - 5 * classic) ** 2 / (6 * 5);
    expectFigures(row(analysis, 'rate').ss, rateSsFilled - bias, 9);
    expectFigures(row(analysis, 'error').ss, totalSsFilled - blockSsFilled - rateSsFilled, 9);
    expect(row(analysis, 'error').df).toBe(14);
    expect(row(analysis, 'total').df).toBe(22);
  });

  it('flags outliers by the Bonferroni test as car::outlierTest does', () => {
    const spiked = gomez.data.map((d) =>
      d.block === 'R3' && d.rate === '50' ? { ...d, value: 9000 } : d,
    );
    const result = analyzeSite(spiked);
    expect(result.outliers.map((o) => `${o.block}/${o.rate}`)).toEqual(['R3/50']);
    const flag = result.outliers[0]!;
    const r = siteChecks.outlierSpiked[0]!;
    // Source: R 4.2.2, car 3.1.1 outlierTest(lm(value ~ block + rate)) (fixtures/reference/site-checks.R)
    expectFigures(flag.studentized, r.rstudent, 10);
    expectFigures(flag.p, r.p, 9);
    expectFigures(flag.pBonferroni, r.pBonferroni, 9);
  });

  it('gives every strip the Bonferroni p of car::outlierTest and flags none in clean data', () => {
    const result = analyzeSite(gomez.data);
    expect(result.outliers).toEqual([]);
    for (const r of siteChecks.outlierClean) {
      const residual = result.residuals.find((x) => x.block === r.block && x.rate === r.rate)!;
      // Source: R 4.2.2, car 3.1.1 outlierTest(..., cutoff = Inf, n.max = Inf); car leaves bonf.p above 1, Sheaf caps it
      expectFigures(residual.pBonferroni!, Math.min(1, r.pBonferroni), 9);
    }
  });
});

describe('analyzeSite Dunnett differences from the reference rate', () => {
  it.each([
    ['every strip', gomez.data, siteChecks.dunnettBalanced],
    [
      'one strip missing',
      gomez.data.filter((d) => !(d.block === 'R2' && d.rate === '75')),
      siteChecks.dunnettMissing,
    ],
  ])('matches multcomp glht Dunnett p within 1e-3 (%s)', (_, rows, expected) => {
    const analysis = analyzeSite(rows, { reference: '100', manyToOne: true });
    for (const difference of analysis.differences) {
      const r = expected.find((x) => x.contrast === `${difference.rate} - 100`)!;
      // Source: R 4.2.2, multcomp 1.4.22 glht(lm(value ~ block + rate), mcp(rate = "Dunnett"))
      // (fixtures/reference/site-checks.R); glht's own integration error is about 1e-3
      expect(Math.abs(difference.pAdjusted! - r.pAdjusted)).toBeLessThan(1e-3);
      expectFigures(difference.se, r.se, 10);
      // Source: as above; glht's quantile is randomised too (±0.01 on the critical value)
      expect(Math.abs(difference.ciLowAdjusted! - r.ciLowAdjusted)).toBeLessThan(0.01 * r.se);
      expect(difference.pAdjusted!).toBeGreaterThanOrEqual(difference.p);
    }
  });
});

describe('analyzeSite on degenerate data', () => {
  const grid = (value: (block: number, rate: number) => number) =>
    [1, 2, 3, 4].flatMap((block) =>
      [1, 2, 3].map((rate) => ({ block: `B${block}`, rate, value: value(block, rate) })),
    );

  it('refuses strips that blocks and rates fit exactly, whatever the rounding noise', () => {
    // Common practice, no published source: y = block + rate is reproduced exactly by the model.
    const exact = grid((block, rate) => 0.1 * block + 0.7 * rate + 1000);
    expect(() => analyzeSite(exact)).toThrow(
      'the strips fit the rates and blocks exactly; Sheaf cannot estimate the strip-to-strip variation',
    );
  });

  it('treats "1" and "1.0" as one rate', () => {
    const rows = grid((block, rate) => 10 + block + rate + ((block * rate) % 3)).map((row) => ({
      ...row,
      rate: row.rate === 1 && row.block === 'B2' ? '1.0' : String(row.rate),
    }));
    const result = analyzeSite(rows);
    expect(result.rates).toBe(3);
    expect(result.means.map((m) => m.rate)).toEqual(['1', '2', '3']);
  });

  it('refuses negative yields and a grand mean of zero, saying why', () => {
    const negative = grid((block, rate) => 10 + block + rate + ((block * rate) % 3));
    negative[4] = { ...negative[4]!, value: -2 };
    expect(() => analyzeSite(negative)).toThrow(/negative value \(-2\)/);
    expect(() => analyzeSite(grid(() => 0))).toThrow(/grand mean is 0/);
  });

  it('names overflow as overflow', () => {
    const huge = grid((block, rate) => 1e160 * (1 + block + rate + ((block * rate) % 3)));
    expect(() => analyzeSite(huge)).toThrow(/overflow/);
  });

  it('analyses a site with 1 error df without Tukey and says so', () => {
    const rows = [
      { block: '1', rate: 1, value: 10 },
      { block: '1', rate: 2, value: 13 },
      { block: '2', rate: 1, value: 11 },
      { block: '2', rate: 2, value: 12 },
    ];
    const result = analyzeSite(rows);
    expect(result.errorDf).toBe(1);
    expect(result.hsd).toBeNull();
    expect(result.means.every((m) => m.group === '')).toBe(true);
    expect(result.notes.join(' ')).toMatch(/Tukey's test needs at least 2/);
  });
});

describe('analyzeSite refusals', () => {
  it('refuses a rate with no data', () => {
    const rows = gomez.data.map((d) => (d.rate === '50' ? { ...d, value: null } : d));
    expect(() => analyzeSite(rows)).toThrow('analyzeSite: rate 50 has no data');
  });

  it('refuses fewer than two blocks with data', () => {
    const rows = gomez.data.map((d) => (d.block !== 'R1' ? { ...d, value: null } : d));
    expect(() => analyzeSite(rows)).toThrow(/fewer than two blocks/);
  });

  it('refuses when no error df is left', () => {
    const rows = [
      { block: '1', rate: 'a', value: 1 },
      { block: '1', rate: 'b', value: 2 },
      { block: '2', rate: 'a', value: 3 },
      { block: '2', rate: 'b', value: null },
    ];
    expect(() => analyzeSite(rows)).toThrow(/no error degrees of freedom/);
  });

  it('refuses a strip listed twice', () => {
    expect(() => analyzeSite([...gomez.data, gomez.data[0]!])).toThrow(/more than once/);
  });
});
