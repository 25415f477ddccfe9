// The reports show the engine's numbers: on the demo trial (read through TypeORM entities and
// derived independently) and on the Gomez & Gomez seeding-rate example loaded as a trial.
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyzeTrial, type AnovaRow, type StripObservation } from '../../../shared/analysis/index';
import type { PooledReport, SiteReport } from '../../../shared/schemas/report';
import { cropFacts, deriveStripValues } from '../../../shared/units/strip-derived';
import { Observation } from '../../../db/entities/observation.entity';
import { RateLevelRow } from '../../../db/entities/rate-level.entity';
import { Site } from '../../../db/entities/site.entity';
import { Strip } from '../../../db/entities/strip.entity';
import { Trial } from '../../../db/entities/trial.entity';
import { buildNetwork, createTestApp, demoIds, signIn, type TestApp } from '../../helpers/app';
import { buildReportTrial } from './build-report-trial';

interface GomezFixture {
  data: { block: string; rateKgPerHa: number; yieldKgPerHa: number }[];
  publishedTable2_6: Record<string, number>;
  r: {
    anova: { source: string; df: number; ss: number; F?: number | null; p?: number | null }[];
    grandMean: number;
    cvPercent: number;
    means: { rateKgPerHa: number; mean: number; ciLow: number; ciHigh: number }[];
  };
}
const gomez = JSON.parse(
  readFileSync(
    new URL('../../../fixtures/reports/gomez-seeding-rate-trial.json', import.meta.url),
    'utf8',
  ),
) as GomezFixture;

const close = (actual: number, expected: number, figures = 9) =>
  expect(Math.abs(actual - expected), `${actual} vs ${expected}`).toBeLessThanOrEqual(
    Math.abs(expected) * 10 ** -figures + 1e-9,
  );
const row = (anova: AnovaRow[], source: string) =>
  anova.find((r) => r.source === source) as AnovaRow & { ms: number; f: number; p: number };

let testApp: TestApp;
beforeAll(async () => {
  testApp = await createTestApp();
});
afterAll(async () => {
  await testApp.close();
});

describe('report numbers on the demo oat trial', () => {
  it('equal the analysis engine run on the same strips', async () => {
    const { dataSource, app } = testApp;
    const { oatTrialId, sites } = await demoIds(dataSource);
    const trial = await dataSource.getRepository(Trial).findOneByOrFail({ id: oatTrialId });
    const levels = await dataSource.getRepository(RateLevelRow).findBy({ trialId: oatTrialId });
    const siteRows = await dataSource.getRepository(Site).findBy({ trialId: oatTrialId });
    const rows: StripObservation[] = [];
    for (const site of siteRows) {
      const strips = await dataSource.getRepository(Strip).findBy({ siteId: site.id });
      for (const strip of strips) {
        const observation = await dataSource
          .getRepository(Observation)
          .findOneBy({ stripId: strip.id });
        const level = levels.find((l) => l.id === strip.rateLevelId)!;
        const derived = deriveStripValues(observation!, {
          unitSystem: trial.unitSystem,
          crop: cropFacts(trial.crop, trial.customCrop),
          rowSpacingIn: trial.rowSpacingIn,
          thousandKernelWeightG: trial.thousandKernelWeightG,
          referenceRate: trial.referenceRate,
          referenceUnit: trial.referenceUnit,
          multiplier: level.multiplier,
          seedPricePerLb: trial.seedPricePerLb,
          grainPricePerBu: trial.grainPricePerBu,
        });
        rows.push({
          site: site.fieldName,
          block: String(strip.block),
          rate: String(level.multiplier),
          value: derived.yieldBushelsPerAcre,
        });
      }
    }
    const engine = analyzeTrial(rows, {
      ratesNumeric: Object.fromEntries(
        levels.map((l) => [String(l.multiplier), l.multiplier * trial.referenceRate!]),
      ),
    });

    const coordinator = await signIn(app, 'coordinator@millbrook.example');
    const first = siteRows.find((s) => s.id === sites[0]!.id)!;
    const siteRes = await coordinator.get(`/api/sites/${first.id}/report`);
    expect(siteRes.status).toBe(200);
    const report = siteRes.body as SiteReport;
    const expected = engine.sites.find((s) => s.site === first.fieldName)!;
    expect(report.analysis!.anova.length).toBe(expected.anova.length);
    for (const entry of expected.anova) {
      const actual = row(report.analysis!.anova, entry.source);
      expect(actual.df).toBe(entry.df);
      close(actual.ss, entry.ss);
    }
    close(report.analysis!.lsd, expected.lsd);
    close(report.analysis!.cvPercent, expected.cvPercent);
    for (const mean of expected.means)
      close(report.analysis!.means.find((m) => m.rate === mean.rate)!.mean, mean.mean);
    for (const d of expected.differences)
      close(report.analysis!.differences.find((x) => x.rate === d.rate)!.p, d.p, 8);
    expect(report.site.completeness).toMatchObject({ strips: 16, withYield: 16, missing: 0 });
    expect(report.findings.length).toBeGreaterThan(3);

    const pooledRes = await coordinator.get(`/api/trials/${oatTrialId}/pooled-report`);
    expect(pooledRes.status).toBe(200);
    const pooled = pooledRes.body as PooledReport;
    expect(pooled.sitesIncluded).toHaveLength(8);
    expect(pooled.sitesExcluded).toHaveLength(0);
    const engineP = engine.pooled!;
    expect(pooled.analysis!.method).toBe(engineP.method);
    for (const entry of engineP.anova)
      close(row(pooled.analysis!.anova, entry.source).ss, entry.ss);
    close(pooled.analysis!.rateTest.f, engineP.rateTest.f);
    expect(pooled.analysis!.rateTest.errorTerm).toBe('site:rate');
    for (const mean of engineP.means)
      close(pooled.analysis!.means.find((m) => m.rate === mean.rate)!.ciLow, mean.ciLow);
    close(pooled.analysis!.bartlett!.chiSquare, engineP.bartlett!.chiSquare);
    close(pooled.analysis!.curve!.quadratic, engineP.curve!.quadratic, 8);
    // The report carries the engine's mixed model (every strip, Kenward–Roger).
    close(pooled.analysis!.mixed!.rateTest.f, engineP.mixed!.rateTest.f);
    expect(pooled.forStatistician!.join(' ')).toMatch(/Kenward–Roger/);
    expect(pooled.siteDifferences).toHaveLength(8 * 3);
    expect(
      pooled.findings.some((f) => /of 8 farms the half rate did as well as the full rate/.test(f)),
    ).toBe(true);
  });

  it('recomputes the economic optimum on the server when the prices change', async () => {
    const { oatTrialId } = await demoIds(testApp.dataSource);
    const coordinator = await signIn(testApp.app, 'coordinator@millbrook.example');
    const cheap = (
      await coordinator.get(`/api/trials/${oatTrialId}/pooled-report?seedPrice=0.1&grainPrice=9.5`)
    ).body as PooledReport;
    const dear = (
      await coordinator.get(`/api/trials/${oatTrialId}/pooled-report?seedPrice=3&grainPrice=9.5`)
    ).body as PooledReport;
    expect(cheap.prices).toEqual({ seedPricePerLb: 0.1, grainPricePerBu: 9.5 });
    expect(cheap.analysis!.curve!.economics!.priceRatio).toBeCloseTo(0.1 / 9.5, 12);
    expect(dear.analysis!.curve!.economics!.priceRatio).toBeCloseTo(3 / 9.5, 12);
    const quarterCheap = cheap.economics.find((e) => e.rate === '0.25')!;
    const quarterDear = dear.economics.find((e) => e.rate === '0.25')!;
    // 20 lb/acre of seed at $0.10 and at $3.00 (quarter of the 80 lb/acre demo reference).
    expect(quarterCheap.seedCost).toBeCloseTo(20 * 0.1, 6);
    expect(quarterDear.seedCost).toBeCloseTo(20 * 3, 6);
  });

  it('re-runs the analysis on the sites a filter chooses', async () => {
    const { oatTrialId } = await demoIds(testApp.dataSource);
    const coordinator = await signIn(testApp.app, 'coordinator@millbrook.example');
    const res = await coordinator.get(
      `/api/trials/${oatTrialId}/pooled-report?soil=${encodeURIComponent('silt loam')}`,
    );
    const report = res.body as PooledReport;
    expect(report.sitesIncluded.map((s) => s.soil)).toEqual(['silt loam', 'silt loam']);
    expect(report.sitesExcluded).toHaveLength(6);
    expect(report.sitesExcluded[0]!.reason).toMatch(/soil is/);
    expect(report.analysis!.sites).toBe(2);
  });
});

// Source: NIST SP 811 (2008 ed.), Appendix B.8 / SI: 1 t = 1000 kg, so kg/ha = t/ha × 1000 and
// (kg/ha)² = (t/ha)² × 1,000,000. The handbook works in kg/ha; a metric report gives t/ha.
const KG_PER_T = 1000;

const gomezRates = [25, 50, 75, 100, 125, 150];
const gomezLevels = gomezRates.map((r) => ({ multiplier: r / 100, label: `${r} kg/ha` }));
const gomezCrop = {
  unitSystem: 'metric' as const,
  crop: 'custom',
  customCrop: {
    name: 'Rice (handbook example)',
    thousandKernelWeightG: 25,
    bushelWeightLb: 45,
    standardMoisturePct: 14,
  },
  referenceRate: 100,
  referenceUnit: 'kg/ha',
  levels: gomezLevels,
};
/** The handbook's strips (kg/ha, as weighed), each raised by `shift(level index)` kg/ha. */
const gomezStrips = (shift: (level: number) => number = () => 0) =>
  gomez.data.map((d) => {
    const level = gomezRates.indexOf(d.rateKgPerHa);
    return { block: Number(d.block.slice(1)), level, yield: d.yieldKgPerHa + shift(level) };
  });

describe('report ANOVA on the Gomez & Gomez (1984) seeding-rate example loaded as a trial', () => {
  it('reproduces the handbook ANOVA, in t/ha on the metric report', async () => {
    const network = await buildNetwork(testApp.dataSource, 'Gomez');
    const built = await buildReportTrial(testApp.dataSource, network, {
      ...gomezCrop,
      sites: [{ fieldName: 'IRRI example field', strips: gomezStrips() }],
    });
    const coordinator = await signIn(testApp.app, network.emails.coordinator);
    const res = await coordinator.get(`/api/sites/${built.siteIds[0]}/report`);
    expect(res.status).toBe(200);
    const report = res.body as SiteReport;
    expect(report.site.units.yield).toBe('t/ha');
    const anova = report.analysis!.anova;
    const table = gomez.publishedTable2_6;
    const kg = (tonnes: number) => tonnes * KG_PER_T;
    const kg2 = (tonnes2: number) => tonnes2 * KG_PER_T * KG_PER_T;
    // Source: Gomez & Gomez (1984), Table 2.6, p. 28 (values rounded as printed), in kg/ha
    expect(row(anova, 'block').df).toBe(table.blockDf);
    expect(Math.round(kg2(row(anova, 'block').ss))).toBe(table.blockSs);
    expect(Math.round(kg2(row(anova, 'block').ms))).toBe(table.blockMs);
    expect(row(anova, 'rate').df).toBe(table.rateDf);
    expect(Math.round(kg2(row(anova, 'rate').ss))).toBe(table.rateSs);
    expect(Math.round(kg2(row(anova, 'rate').ms))).toBe(table.rateMs);
    expect(Number(row(anova, 'rate').f.toFixed(2))).toBe(table.rateF);
    expect(Math.round(kg2(row(anova, 'error').ss))).toBe(table.errorSs);
    expect(Math.round(kg2(row(anova, 'error').ms))).toBe(table.errorMs);
    expect(Math.round(kg2(row(anova, 'total').ss))).toBe(table.totalSs);
    expect(Number(report.analysis!.cvPercent.toFixed(1))).toBe(table.cvPercent);
    expect(Math.round(kg(report.analysis!.grandMean))).toBe(table.grandMean);
    // Source: R 4.2.2 anova(lm(y ~ block + rate)) on Gomez & Gomez (1984) p. 26 data
    for (const expected of gomez.r.anova) {
      const actual = row(anova, expected.source === 'treatment' ? 'rate' : expected.source);
      close(kg2(actual.ss), expected.ss, 8);
      if (expected.p != null) close(actual.p, expected.p, 6);
    }
    // Source: R 4.2.2 emmeans confint on the same data
    for (const expected of gomez.r.means) {
      const mean = report.analysis!.means.find(
        (m) => m.rate === String(expected.rateKgPerHa / 100),
      )!;
      close(kg(mean.mean), expected.mean, 9);
      close(kg(mean.ciLow), expected.ciLow, 8);
      close(kg(mean.ciHigh), expected.ciHigh, 8);
    }
    // Differences from the reference are the kg/ha ones ÷ 1000: 75 minus 100 kg seed/ha is
    // 5,304.25 − 4,847.75 = 456.5 kg/ha (R means above), 0.4565 t/ha.
    const diff = report.analysis!.differences.find((d) => d.rate === '0.75')!;
    close(diff.diff, (5304.25 - 4847.75) / KG_PER_T, 9);
    // Source: R 4.2.2 on the same data: standard error of a difference 235.115 kg/ha.
    close(diff.se, 235.115302682653 / KG_PER_T, 8);
    // Source: R 4.2.2 qt(0.975, 15) × sed on the same data: LSD (5 %) 501.136 kg/ha = 0.501 t/ha.
    close(report.analysis!.lsd, 501.13640505709 / KG_PER_T, 8);
    // Component means carry the same unit as the analysis.
    const full = report.components.byRate.find((c) => c.rate === '1')!;
    close(full.yield!, 4847.75 / KG_PER_T, 9);
    // The F test is not significant (p = 0.11) and every Dunnett interval holds zero: the grower
    // reads that no rate differed detectably, in plain words, and the F test under the statistician's part.
    expect(report.findings[0]).toMatch(
      /^At this site no rate yielded detectably differently from the /,
    );
    expect(report.forStatistician![0]).toMatch(/rate F = 2\.17 on 5 and 15 df, p = 0\.11/);
    // The statistician's numbers in t/ha with two decimals, the error mean square in (t/ha)² with
    // four: 110,558 (kg/ha)² = 0.1106 (t/ha)²; LSD 0.50 t/ha.
    const notes = report.forStatistician!.join(' ');
    expect(notes).toContain('Error mean square 0.1106 on 15 df');
    expect(notes).toContain('LSD (5 %) 0.50;');
    // The grower's words give yields in t/ha (the rate labels stay kg/ha of seed).
    const words = report.findings.join(' ');
    expect(words).toContain('the difference, +0.46 t/ha,');
    expect(words).toContain('a difference of about 0.50 t/ha or more');
  });

  it('pools two metric sites in t/ha: rate means are the site means’ average ÷ 1000', async () => {
    const network = await buildNetwork(testApp.dataSource, 'GomezPooled');
    // The second site is the handbook's field with each strip 200 + 40 × (rate's index) kg/ha
    // higher (invented), so site × rate is not zero.
    const shift = (level: number) => 200 + 40 * level;
    const built = await buildReportTrial(testApp.dataSource, network, {
      ...gomezCrop,
      sites: [
        { fieldName: 'IRRI example field', strips: gomezStrips() },
        { fieldName: 'A richer field', strips: gomezStrips(shift) },
      ],
    });
    const coordinator = await signIn(testApp.app, network.emails.coordinator);
    const res = await coordinator.get(`/api/trials/${built.trialId}/pooled-report`);
    expect(res.status).toBe(200);
    const report = res.body as PooledReport;
    expect(report.trial.units.yield).toBe('t/ha');
    expect(report.trial.units.seed).toBe('kg/ha');
    expect(report.analysis, report.analysisError ?? '').not.toBeNull();
    // Source: R 4.2.2 means above (kg/ha): the pooled mean of a balanced pair of sites is their
    // average, the handbook mean + half the shift; e.g. 100 kg seed/ha: (4,847.75 + 160) ÷ 1000.
    for (const expected of gomez.r.means) {
      const mean = report.analysis!.means.find(
        (m) => m.rate === String(expected.rateKgPerHa / 100),
      )!;
      const level = gomezRates.indexOf(expected.rateKgPerHa);
      close(mean.mean, (expected.mean + shift(level) / 2) / KG_PER_T, 9);
    }
    // 75 minus 100 kg seed/ha: 456.5 kg/ha at the first site, 456.5 − 40 at the second; pooled
    // 436.5 kg/ha = 0.4365 t/ha.
    const pooledDiff = report.analysis!.differences.find((d) => d.rate === '0.75')!;
    close(pooledDiff.diff, (5304.25 - 4847.75 - 20) / KG_PER_T, 9);
    expect(report.findings.join(' ')).toMatch(/\d\.\d\d t\/ha/);
  });
});
