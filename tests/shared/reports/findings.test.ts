// Findings text for a clear, a borderline and a null result, at one site and over sites.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  analyzePooled,
  analyzeSite,
  type SiteAnalysis,
  type StripObservation,
} from '../../../shared/analysis/index';
import {
  classifyDifference,
  pooledFindings,
  pooledStatisticianNotes,
  rateName,
  siteFindings,
  siteStatisticianNotes,
} from '../../../shared/reports/findings';
import { formatMoney, formatNumber, formatP } from '../../../shared/reports/format-numbers';

interface FindingsFixture {
  rates: string[];
  labels: Record<string, string>;
  sites: Record<'clear' | 'borderline' | 'null', number[]>;
}
const fixture = JSON.parse(
  readFileSync(new URL('../../../fixtures/reports/findings-sites.json', import.meta.url), 'utf8'),
) as FindingsFixture;

const rowsOf = (values: number[], site = 'A'): StripObservation[] =>
  values.map((value, i) => ({
    site,
    block: String(Math.floor(i / 4) + 1),
    rate: fixture.rates[i % 4]!,
    value,
  }));
const analysisOf = (name: keyof FindingsFixture['sites']): SiteAnalysis =>
  analyzeSite(rowsOf(fixture.sites[name]), { manyToOne: true });
const findingsOf = (
  analysis: SiteAnalysis,
  extra: Partial<Parameters<typeof siteFindings>[0]> = {},
) => siteFindings({ analysis, rateLabels: fixture.labels, yieldUnit: 'bu/acre', ...extra });

describe('siteFindings', () => {
  const signed = (value: number) =>
    value < 0 ? `−${formatNumber(-value, 1)}` : `+${formatNumber(value, 1)}`;

  it('leads with which rate clearly differed and reads the Dunnett-adjusted interval, said as such', () => {
    const analysis = analysisOf('clear');
    const quarter = analysis.differences.find((d) => d.rate === '0.25')!;
    // The adjusted interval holds for all three comparisons together, so it is wider.
    expect(quarter.ciHighAdjusted! - quarter.ciLowAdjusted!).toBeGreaterThan(
      quarter.ciHigh - quarter.ciLow,
    );
    const text = findingsOf(analysis);
    expect(text[0]).toBe(
      'At this site the quarter rate yielded clearly less than the full rate; the half rate and double rate yielded about as much as the full rate.',
    );
    expect(text[1]).toBe(
      `The quarter rate yielded less than the full rate here: ${formatNumber(-quarter.diff, 1)} bu/acre less, more than strip-to-strip variation explains (95 % interval ${signed(quarter.ciLowAdjusted!)} to ${signed(quarter.ciHighAdjusted!)} bu/acre, Dunnett-adjusted). Cutting seed to the quarter rate cost yield on this field.`,
    );
    expect(text.at(-1)).toMatch(/^This is one field in one season\./);
  });

  it('calls a borderline difference a hint to check, not a result', () => {
    const analysis = analysisOf('borderline');
    const quarter = analysis.differences.find((d) => d.rate === '0.25')!;
    expect(quarter.p).toBeGreaterThan(0.05);
    expect(quarter.p).toBeLessThan(0.1);
    const text = findingsOf(analysis);
    expect(text[1]).toMatch(
      /^The quarter rate yielded about as much as the full rate here: .* The gap leans one way but is not settled: treat it as a hint to check against the other sites, not as a result\.$/,
    );
    expect(text.join(' ')).not.toMatch(/more than strip-to-strip variation explains/);
  });

  it('says a null result is within strip-to-strip variation, with no test statistics', () => {
    const analysis = analysisOf('null');
    const half = analysis.differences.find((d) => d.rate === '0.5')!;
    const text = findingsOf(analysis);
    expect(text[0]).toMatch(/^At this site no rate yielded detectably differently/);
    expect(text).toContain(
      `The half rate yielded about as much as the full rate here: the difference, ${signed(half.diff)} bu/acre, is within what strip-to-strip variation explains (95 % interval ${signed(half.ciLowAdjusted!)} to ${signed(half.ciHighAdjusted!)} bu/acre, Dunnett-adjusted). It saved seed without a yield loss this site could detect.`,
    );
    expect(text.join(' ')).not.toMatch(/\bproves?\b|\bwill\b|always|guarantee/i);
    // Plain words first: F, df, p and residuals are for the statistician.
    expect(text.join(' ')).not.toMatch(/\bF = |\bdf\b|\bp [=<]|studentized|Bartlett/);
    const details = siteStatisticianNotes({
      analysis,
      rateLabels: fixture.labels,
      yieldUnit: 'bu/acre',
    });
    expect(details[0]).toMatch(
      /^Analysis of variance \(RCBD, balanced\): rate F = .* on 3 and 9 df/,
    );
    expect(details.join(' ')).toMatch(/Dunnett p = /);
    expect(details.join(' ')).toMatch(/Outlier test .* Bonferroni-adjusted over 16 strips/);
  });

  it('hedges the economics when the cheaper rate’s yield gap is not detectable', () => {
    const text = findingsOf(analysisOf('null'), {
      returns: [
        { rate: '0.25', returnOverSeedCost: 410 },
        { rate: '0.5', returnOverSeedCost: 432.5 },
        { rate: '1', returnOverSeedCost: 420 },
        { rate: '2', returnOverSeedCost: 380 },
      ],
      prices: { seedPricePerLb: 0.5, grainPricePerBu: 8 },
    });
    expect(text).toContain(
      'With grain at $8.00/bu and seed at $0.50/lb, half rate gave the highest return over seed cost, $12.50 per acre more than the full rate; the seed saving is certain, but the yield part of the gap is within what this site could not tell apart.',
    );
  });

  it('explains missing strips and flags a high CV', () => {
    const values: (number | null)[] = [...fixture.sites.null];
    values[5] = null;
    values[0] = 30;
    values[10] = 90;
    const analysis = analyzeSite(
      values.map((value, i) => ({
        block: String(Math.floor(i / 4) + 1),
        rate: fixture.rates[i % 4]!,
        value,
      })),
    );
    const text = findingsOf(analysis).join('\n');
    expect(text).toMatch(
      /One strip had no yield \(block 2, half rate\); the analysis filled it in/,
    );
    expect(text).toMatch(/a lot of variation for a strip trial/);
    expect(text).toMatch(/least significant difference, 5 %, one comparison/);
  });
});

describe('pooledFindings', () => {
  const sites = (names: (keyof FindingsFixture['sites'])[]) =>
    names.flatMap((name, i) =>
      rowsOf(
        fixture.sites[name].map((v) => v + i * 3),
        `Site ${i + 1}`,
      ),
    );

  it('counts how many sites agreed and names what the network could not tell', () => {
    const rows = sites(['null', 'null', 'borderline', 'clear']);
    const analysis = analyzePooled(rows, {
      ratesNumeric: { '0.25': 25, '0.5': 50, '1': 100, '2': 200 },
    });
    const siteLsd = new Map(
      ['Site 1', 'Site 2', 'Site 3', 'Site 4'].map((s, i) => [
        s,
        analyzeSite(rows.filter((r) => r.site === s)).lsd + i * 0,
      ]),
    );
    const text = pooledFindings({
      analysis,
      rateLabels: fixture.labels,
      yieldUnit: 'bu/acre',
      seedUnit: 'lb/acre',
      siteDifferences: analysis.siteDifferences.map((d) => ({ ...d, lsd: siteLsd.get(d.site)! })),
      sitesExcluded: [{ name: 'Late field', reason: 'no yields entered yet' }],
    });
    expect(text[0]).toBe(
      '4 sites were analysed together; 1 site was left out (Late field: no yields entered yet).',
    );
    expect(text[1]).toMatch(
      /^Over the network, the (seeding rate changed|rates did not change) yield/,
    );
    const within = analysis.siteDifferences.filter((d) => d.rate === '0.5' && d.p >= 0.05).length;
    expect(text.join('\n')).toContain(
      `In ${within} of 4 farms the half rate did as well as the full rate`,
    );
    // Plain words first: no test statistics in what a grower reads.
    expect(text.join(' ')).not.toMatch(/\bF = |\bdf\b|Bartlett|studentized|R²/);
    const details = pooledStatisticianNotes({
      analysis,
      rateLabels: fixture.labels,
      yieldUnit: 'bu/acre',
      seedUnit: 'lb/acre',
      siteDifferences: [],
      sitesExcluded: [],
    });
    expect(details[0]).toMatch(/rate F = .* tested against the site × rate interaction/);
    expect(details.join(' ')).toMatch(/Kenward–Roger/);
    expect(details.join(' ')).toMatch(/Bartlett's test/);
    expect(text.at(-1)).toMatch(
      /^What the network could not tell: differences smaller than about .* bu\/acre between rates \(the smallest gap the combined analysis could detect, one comparison at a time\); whether the answer holds .* one season/,
    );
  });

  it('warns when there are too few sites to travel', () => {
    const rows = sites(['clear', 'null']);
    const analysis = analyzePooled(rows);
    const text = pooledFindings({
      analysis,
      rateLabels: fixture.labels,
      yieldUnit: 'bu/acre',
      seedUnit: 'lb/acre',
      siteDifferences: [],
      sitesExcluded: [],
    });
    expect(text.at(-1)).toMatch(/only 2 sites; four to six is a usual minimum/);
  });
});

describe('wording helpers', () => {
  it('names rates and classifies differences', () => {
    expect(rateName('half')).toBe('half rate');
    expect(rateName('25 kg/ha')).toBe('25 kg/ha');
    expect(classifyDifference({ diff: -2.1, p: 0.4 }, 4.8, 0.05)).toBe('undetectable');
    expect(classifyDifference({ diff: -4.0, p: 0.12 }, 4.8, 0.05)).toBe('borderline');
    expect(classifyDifference({ diff: -6.0, p: 0.01 }, 4.8, 0.05)).toBe('clear');
    expect(formatMoney(-3.456)).toBe('−$3.46');
    expect(formatP(0.1128)).toBe('p = 0.11');
    expect(formatNumber(5124.25, 0)).toBe('5,124');
  });
});
