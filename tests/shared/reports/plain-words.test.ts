// The plain-words sentence builders every report reads: a rate clearly better, clearly worse or
// not detectably different from the reference, too few data, and the one-season caution.
import { describe, expect, it } from 'vitest';
import {
  comparisonHeadline,
  comparisonLine,
  comparisonSentence,
  comparisonVerdict,
  farmsAgreeSentence,
  intervalText,
  notEnoughDataSentence,
  oneSeasonCaution,
  outlierSentence,
  type Comparison,
} from '../../../shared/reports/plain-words';

const site = { unit: 'bu/acre', digits: 1, scope: 'site' as const };
const half: Comparison = {
  rate: 'half rate',
  reference: 'full rate',
  estimate: -1.2,
  low: -4.0,
  high: 1.6,
  kind: 'dunnett',
  moreSeed: false,
};

// Common practice, no published source: the wording rules are Sheaf's own (every number says
// which interval it is; "clearly" only when the whole interval is on one side of zero).
describe('comparisonSentence', () => {
  it('says a rate yielded about as much when its interval holds zero, and names the interval', () => {
    expect(comparisonVerdict(half)).toBe('same');
    expect(comparisonSentence(half, site)).toBe(
      'The half rate yielded about as much as the full rate here: the difference, −1.2 bu/acre, is within what strip-to-strip variation explains (95 % interval −4.0 to +1.6 bu/acre, Dunnett-adjusted). It saved seed without a yield loss this site could detect.',
    );
  });

  it('says a rate yielded clearly less, and what that cost, when the whole interval is below zero', () => {
    const quarter = { ...half, rate: 'quarter rate', estimate: -16, low: -19.1, high: -12.9 };
    expect(comparisonVerdict(quarter)).toBe('less');
    expect(comparisonSentence(quarter, site)).toBe(
      'The quarter rate yielded less than the full rate here: 16.0 bu/acre less, more than strip-to-strip variation explains (95 % interval −19.1 to −12.9 bu/acre, Dunnett-adjusted). Cutting seed to the quarter rate cost yield on this field.',
    );
  });

  it('says a rate yielded clearly more and asks to weigh the extra seed, in the trial’s metric units', () => {
    const double = {
      ...half,
      rate: 'double rate',
      estimate: 410,
      low: 120,
      high: 700,
      kind: 'unadjusted' as const,
      moreSeed: true,
    };
    const text = comparisonSentence(double, { unit: 'kg/ha', digits: 0, scope: 'network' });
    expect(text).toBe(
      'The double rate yielded more than the full rate on average across the farms: 410 kg/ha more, more than the differences between farms explain (95 % interval +120 to +700 kg/ha, this comparison alone, not adjusted). Weigh that gain against the cost of the extra seed (see the return over seed cost).',
    );
  });

  it('calls a gap that leans one way a hint, and the extra seed of a higher rate money for nothing', () => {
    expect(comparisonSentence({ ...half, lean: true }, site)).toMatch(
      /leans one way but is not settled: treat it as a hint to check against the other sites, not as a result\.$/,
    );
    expect(comparisonSentence({ ...half, moreSeed: true, rate: 'double rate' }, site)).toMatch(
      /The extra seed bought no yield gain this site could detect\.$/,
    );
  });

  it('gives the short line and the headline without test statistics', () => {
    const quarter = { ...half, rate: 'quarter rate', estimate: -16, low: -19.1, high: -12.9 };
    expect(comparisonLine(half, site)).toBe(
      'Half rate: about as much as the full rate (−1.2 bu/acre; 95 % interval −4.0 to +1.6 bu/acre, Dunnett-adjusted).',
    );
    expect(comparisonHeadline([quarter, half], 'site')).toBe(
      'At this site the quarter rate yielded clearly less than the full rate; the half rate yielded about as much as the full rate.',
    );
    expect(comparisonHeadline([half], 'network')).toBe(
      'Across the network no rate yielded detectably differently from the full rate: every gap was within what the differences between farms explain.',
    );
    expect(intervalText({ ...half, level: 90 }, site)).toBe(
      '90 % interval −4.0 to +1.6 bu/acre, Dunnett-adjusted',
    );
  });
});

describe('other plain-words sentences', () => {
  it('says when too few strips have a yield to compare rates', () => {
    expect(notEnoughDataSentence({ withYield: 5, strips: 16 })).toBe(
      'Only 5 of 16 strips have a yield so far: too few to compare the rates at this site yet. Once every rate has a yield in at least two blocks, this report says what the strips show.',
    );
  });

  it('cautions that one season (and one field) can mislead', () => {
    expect(oneSeasonCaution('site')).toMatch(/^This is one field in one season\./);
    expect(oneSeasonCaution('network')).toMatch(/^This is one season\. .*next season/);
    expect(oneSeasonCaution('network', 2)).toMatch(/pools 2 seasons/);
  });

  it('counts the farms that agreed and names a flagged strip with its adjusted p', () => {
    expect(
      farmsAgreeSentence({
        rate: 'half rate',
        reference: 'full rate',
        within: 6,
        lower: 2,
        higher: 0,
        total: 8,
      }),
    ).toBe(
      'In 6 of 8 farms the half rate did as well as the full rate (no difference that farm’s own strips could detect); it did detectably worse at two and detectably better at none.',
    );
    expect(
      outlierSentence({ block: '3', rate: 'full rate', value: 82.14, pBonferroni: 0.0042 }, site),
    ).toBe(
      'The strip in block 3 at the full rate (82.1 bu/acre) is further from what its block and rate predict than chance explains, even allowing for checking every strip (outlier test, Bonferroni-adjusted p = 0.004): it stays in the analysis; check its weight, moisture and harvested area before leaning on it.',
    );
  });
});
