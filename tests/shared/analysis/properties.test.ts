import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyzeSite, type SiteAnalysis } from '../../../shared/analysis/index';

const blocks = ['B1', 'B2', 'B3', 'B4'];
const rates = ['0.25', '0.5', '1', '2'];
// 16 strip values with enough spread that the residual variance is never zero.
const values = fc.array(fc.double({ min: 10, max: 100, noNaN: true }), {
  minLength: 16,
  maxLength: 16,
});
const withMissing = fc.record({
  values,
  missing: fc.option(fc.integer({ min: 0, max: 15 }), { nil: undefined }),
});
const build = (ys: number[], missing?: number) =>
  ys.map((value, i) => ({
    block: blocks[Math.floor(i / 4)]!,
    rate: rates[i % 4]!,
    value: i === missing ? null : value,
  }));
const ss = (a: SiteAnalysis) => a.anova.map((r) => r.ss);
const close = (a: number, b: number, scale: number) =>
  Math.abs(a - b) <= 1e-7 * Math.max(1, Math.abs(scale));

describe('analyzeSite properties', () => {
  it('gives the same means and SS whatever the row order', () => {
    fc.assert(
      fc.property(withMissing, fc.integer(), ({ values: ys, missing }, seed) => {
        const rows = build(ys, missing);
        const shuffled = [...rows].sort(
          (a, b) => (((a.value ?? 0) * 7919 + seed) % 13) - (((b.value ?? 0) * 7919 + seed) % 13),
        );
        const a = analyzeSite(rows);
        const b = analyzeSite(shuffled);
        ss(a).forEach((x, i) => expect(close(x, ss(b)[i]!, x)).toBe(true));
        a.means.forEach((m, i) => expect(close(m.mean, b.means[i]!.mean, m.mean)).toBe(true));
      }),
      { numRuns: 60 },
    );
  });

  it('leaves the SS unchanged when a constant is added', () => {
    fc.assert(
      fc.property(
        withMissing,
        fc.double({ min: -50, max: 500, noNaN: true }),
        ({ values: ys, missing }, shift) => {
          const a = analyzeSite(build(ys, missing));
          const b = analyzeSite(
            build(
              ys.map((y) => y + shift),
              missing,
            ),
          );
          ss(a).forEach((x, i) =>
            expect(Math.abs(x - ss(b)[i]!)).toBeLessThan(1e-6 * Math.max(1, ss(a)[3]!)),
          );
          a.means.forEach((m, i) => expect(b.means[i]!.mean - m.mean).toBeCloseTo(shift, 6));
        },
      ),
      { numRuns: 60 },
    );
  });

  it('scales every SS by c² when the response is multiplied by c', () => {
    fc.assert(
      fc.property(
        withMissing,
        fc.double({ min: 0.1, max: 20, noNaN: true }),
        ({ values: ys, missing }, c) => {
          const a = analyzeSite(build(ys, missing));
          const b = analyzeSite(
            build(
              ys.map((y) => y * c),
              missing,
            ),
          );
          ss(a).forEach((x, i) =>
            expect(close(ss(b)[i]!, c * c * x, c * c * ss(a)[3]!)).toBe(true),
          );
          expect(b.anova[1]).toMatchObject({ df: a.anova[1]!.df });
        },
      ),
      { numRuns: 60 },
    );
  });
});
