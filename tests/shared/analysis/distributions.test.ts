import { describe, expect, it } from 'vitest';
import {
  chiSquareUpperTailP,
  fUpperTailP,
  studentTQuantile,
  studentTTwoSidedP,
  studentizedRangeQuantile,
  studentizedRangeUpperTailP,
} from '../../../shared/analysis/index';
import { expectFigures, readFixture } from '../helpers';

type Distributions = {
  qt: { df: number; 'qt_0.975': number; 'qt_0.95': number; 'qt_0.995': number }[];
  qf: { df1: number; df2: number; 'qf_0.95': number; 'qf_0.99': number }[];
  qtukey: { k: number; df: number; 'qtukey_0.95': number; 'qtukey_0.99': number }[];
  qchisq: { df: number; 'qchisq_0.95': number }[];
  pf_upper: { F: number; df1: number; df2: number; p_upper: number }[];
  pt: { t: number; df: number; p_two_sided: number }[];
  ptukey_upper: { q: number; k: number; df: number; p_upper: number }[];
  pchisq_upper: { x: number; df: number; p_upper: number }[];
  qtukey_k2_exact: { df: number; 'exact_sqrt2_qt_0.975': number; 'qtukey_0.95': number }[];
};
const reference = readFixture<Distributions>('r-distributions.json');

describe('distribution functions against R 4.2.2', () => {
  it('matches qt to 7 significant figures', () => {
    for (const row of reference.qt) {
      // Source: R 4.2.2 qt(p, df)
      expectFigures(studentTQuantile(0.975, row.df), row['qt_0.975'], 7);
      expectFigures(studentTQuantile(0.95, row.df), row['qt_0.95'], 7);
      expectFigures(studentTQuantile(0.995, row.df), row['qt_0.995'], 7);
    }
  });

  it('matches qf through the upper-tail probability', () => {
    for (const row of reference.qf) {
      // Source: R 4.2.2 qf(0.95 / 0.99, df1, df2): the upper tail at those points is 0.05 / 0.01
      expectFigures(fUpperTailP(row['qf_0.95'], row.df1, row.df2), 0.05, 6);
      expectFigures(fUpperTailP(row['qf_0.99'], row.df1, row.df2), 0.01, 6);
    }
  });

  it('matches pf, pt and pchisq upper tails', () => {
    // Source: R 4.2.2 pf(F, df1, df2, lower.tail = FALSE)
    for (const row of reference.pf_upper)
      expectFigures(fUpperTailP(row.F, row.df1, row.df2), row.p_upper, 6);
    // Source: R 4.2.2 2 * pt(-abs(t), df)
    for (const row of reference.pt)
      expectFigures(studentTTwoSidedP(row.t, row.df), row.p_two_sided, 6);
    // Source: R 4.2.2 pchisq(x, df, lower.tail = FALSE)
    for (const row of reference.pchisq_upper)
      expectFigures(chiSquareUpperTailP(row.x, row.df), row.p_upper, 6);
    // Source: R 4.2.2 qchisq(0.95, df)
    for (const row of reference.qchisq)
      expectFigures(chiSquareUpperTailP(row['qchisq_0.95'], row.df), 0.05, 6);
  });

  it('matches qtukey within R’s documented 4-decimal accuracy', () => {
    for (const row of reference.qtukey.filter((r) => r.k > 2)) {
      // Source: R 4.2.2 qtukey(0.95 / 0.99, k, df)
      expect(
        Math.abs(studentizedRangeQuantile(0.95, row.k, row.df) - row['qtukey_0.95']),
      ).toBeLessThan(1e-4);
      expect(
        Math.abs(studentizedRangeQuantile(0.99, row.k, row.df) - row['qtukey_0.99']),
      ).toBeLessThan(1e-4);
    }
  });

  it('uses the exact identity q = √2·t for two means, where R’s qtukey is up to 2e-4 high at df 4', () => {
    for (const row of reference.qtukey_k2_exact) {
      // Source: R 4.2.2 sqrt(2) * qt(0.975, df)
      expectFigures(studentizedRangeQuantile(0.95, 2, row.df), row['exact_sqrt2_qt_0.975'], 7);
    }
    for (const row of reference.qt) {
      // Source: R 4.2.2 sqrt(2) * qt(0.995, df)
      expectFigures(studentizedRangeQuantile(0.99, 2, row.df), Math.SQRT2 * row['qt_0.995'], 7);
    }
    const rDf4 = reference.qtukey.find((r) => r.k === 2 && r.df === 4)!;
    // Source: R 4.2.2 qtukey(0.99, 2, 4) = 6.511369, above the exact 6.511175
    expect(rDf4['qtukey_0.99'] - studentizedRangeQuantile(0.99, 2, 4)).toBeGreaterThan(1e-4);
  });

  it('matches ptukey upper tails', () => {
    // Source: R 4.2.2 ptukey(q, k, df, lower.tail = FALSE)
    for (const row of reference.ptukey_upper) {
      expect(Math.abs(studentizedRangeUpperTailP(row.q, row.k, row.df) - row.p_upper)).toBeLessThan(
        1e-5,
      );
    }
  });

  it('throws naming the function for impossible arguments', () => {
    expect(() => studentTQuantile(1.2, 5)).toThrow(/studentTQuantile/);
    expect(() => fUpperTailP(-1, 2, 3)).toThrow(/fUpperTailP/);
    expect(() => studentizedRangeQuantile(0.95, 1, 10)).toThrow(/studentizedRangeQuantile/);
  });
});
