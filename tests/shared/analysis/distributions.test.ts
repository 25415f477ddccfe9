import { describe, expect, it } from 'vitest';
import {
  chiSquareQuantile,
  chiSquareUpperTailP,
  fQuantile,
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
  qtukey: {
    k: number;
    df: number;
    'qtukey_0.95': number;
    'qtukey_0.99': number;
    'qtukey_0.95_refined_uniroot': number;
  }[];
  qchisq: { df: number; 'qchisq_0.95': number }[];
  pf_upper: { F: number; df1: number; df2: number; p_upper: number }[];
  pt: { t: number; df: number; p_two_sided: number }[];
  ptukey_upper: { q: number; k: number; df: number; p_upper: number }[];
  pchisq_upper: { x: number; df: number; p_upper: number }[];
  qtukey_k2_exact: { df: number; 'exact_sqrt2_qt_0.975': number; 'qtukey_0.95': number }[];
};
const reference = readFixture<Distributions>('r-distributions.json');
type Tails = {
  pchisq: { x: number; df: number; p: number }[];
  pf: { f: number; df1: number; df2: number; p: number }[];
  pt: { t: number; df: number; p: number }[];
  qt: { p: number; df: number; q: number }[];
};
const tails = readFixture<Tails>('r-distribution-tails.json');

/** R prints 15 significant figures, so 1e-10 relative leaves room only for our own error. */
function expectRelative(actual: number, expected: number, tolerance: number): void {
  expect(Math.abs(actual - expected) / Math.abs(expected), `${actual} vs ${expected}`).toBeLessThan(
    tolerance,
  );
}

describe('distribution functions against R 4.2.2', () => {
  it('matches qt to 1e-10 relative', () => {
    for (const row of reference.qt) {
      // Source: R 4.2.2 qt(p, df)
      expectRelative(studentTQuantile(0.975, row.df), row['qt_0.975'], 1e-10);
      expectRelative(studentTQuantile(0.95, row.df), row['qt_0.95'], 1e-10);
      expectRelative(studentTQuantile(0.995, row.df), row['qt_0.995'], 1e-10);
      // Source: symmetry of t, qt(1 − p) = −qt(p)
      expectRelative(studentTQuantile(0.025, row.df), -row['qt_0.975'], 1e-10);
    }
  });

  it('matches qf and qchisq to 1e-10 relative', () => {
    for (const row of reference.qf) {
      // Source: R 4.2.2 qf(0.95 / 0.99, df1, df2)
      expectRelative(fQuantile(0.95, row.df1, row.df2), row['qf_0.95'], 1e-10);
      expectRelative(fQuantile(0.99, row.df1, row.df2), row['qf_0.99'], 1e-10);
      // Source: R 4.2.2 — at qf(0.95) the upper tail is 0.05
      expectRelative(fUpperTailP(row['qf_0.95'], row.df1, row.df2), 0.05, 1e-10);
    }
    for (const row of reference.qchisq) {
      // Source: R 4.2.2 qchisq(0.95, df)
      expectRelative(chiSquareQuantile(0.95, row.df), row['qchisq_0.95'], 1e-10);
    }
  });

  it('matches pf, pt and pchisq upper tails to 1e-10 relative', () => {
    // Source: R 4.2.2 pf(F, df1, df2, lower.tail = FALSE)
    for (const row of reference.pf_upper)
      expectRelative(fUpperTailP(row.F, row.df1, row.df2), row.p_upper, 1e-10);
    // Source: R 4.2.2 2 * pt(-abs(t), df)
    for (const row of reference.pt)
      expectRelative(studentTTwoSidedP(row.t, row.df), row.p_two_sided, 1e-10);
    // Source: R 4.2.2 pchisq(x, df, lower.tail = FALSE)
    for (const row of reference.pchisq_upper)
      expectRelative(chiSquareUpperTailP(row.x, row.df), row.p_upper, 1e-10);
    // Source: R 4.2.2 qchisq(0.95, df)
    for (const row of reference.qchisq)
      expectRelative(chiSquareUpperTailP(row['qchisq_0.95'], row.df), 0.05, 1e-10);
  });

  it('keeps full relative precision far below 1e-16 in the upper tails', () => {
    for (const row of tails.pchisq) {
      // Source: R 4.2.2 pchisq(x, df, lower.tail = FALSE) (fixtures/reference/distribution-tails.R)
      expectRelative(chiSquareUpperTailP(row.x, row.df), row.p, 1e-10);
    }
    for (const row of tails.pf) {
      // Source: R 4.2.2 pf(f, df1, df2, lower.tail = FALSE) (fixtures/reference/distribution-tails.R)
      expectRelative(fUpperTailP(row.f, row.df1, row.df2), row.p, 1e-10);
    }
    for (const row of tails.pt) {
      // Source: R 4.2.2 2 * pt(-abs(t), df) (fixtures/reference/distribution-tails.R)
      expectRelative(studentTTwoSidedP(row.t, row.df), row.p, 1e-10);
    }
    for (const row of tails.qt) {
      // Source: R 4.2.2 qt(p, df) at fractional (Kenward–Roger-like) df (fixtures/reference/distribution-tails.R)
      expectRelative(studentTQuantile(row.p, row.df), row.q, 1e-10);
    }
  });

  it('solves ptukey(q) = 0.95 to 1e-6, tighter than R’s own qtukey', () => {
    for (const row of reference.qtukey.filter((r) => r.k > 2)) {
      // Source: R 4.2.2 uniroot(function(q) ptukey(q, k, df) - 0.95, tol = 1e-13)
      expectRelative(
        studentizedRangeQuantile(0.95, row.k, row.df),
        row['qtukey_0.95_refined_uniroot'],
        1e-6,
      );
    }
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

  it('matches ptukey upper tails to 1e-6 relative', () => {
    // Source: R 4.2.2 ptukey(q, k, df, lower.tail = FALSE)
    for (const row of reference.ptukey_upper) {
      expectRelative(studentizedRangeUpperTailP(row.q, row.k, row.df), row.p_upper, 1e-6);
    }
  });

  it('throws naming the function for impossible arguments', () => {
    expect(() => studentTQuantile(1.2, 5)).toThrow(/studentTQuantile/);
    expect(() => fUpperTailP(-1, 2, 3)).toThrow(/fUpperTailP/);
    expect(() => studentizedRangeQuantile(0.95, 1, 10)).toThrow(/studentizedRangeQuantile/);
  });
});
