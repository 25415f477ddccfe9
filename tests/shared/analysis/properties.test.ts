import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyzeSite, type SiteAnalysis } from '../../../shared/analysis/index';

const blocks = ['B1', 'B2', 'B3', 'B4'];
const rates = ['0.25', '0.5', '1', '2'];
// 16 strip values with enough spread that the residual variance is never zero (constant
// strips fit blocks and rates exactly and are refused).
const values = fc
  .array(fc.double({ min: 10, max: 100, noNaN: true }), { minLength: 16, maxLength: 16 })
  .filter((ys) => new Set(ys).size > 8);
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
        // Yields cannot be negative, so shifts keep them at or above zero.
        fc.double({ min: -10, max: 500, noNaN: true }),
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

describe('Bonferroni outlier test on clean simulated sites', () => {
  /** Seeded generator (mulberry32) so the simulation is the same on every run. */
  function generator(seed: number): () => number {
    let state = seed >>> 0;
    return () => {
      state = (state + 0x6d2b79f5) >>> 0;
      let t = state;
      t = Math.imul(t ^ (t >>> 15), t | 1);
      t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
      return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
    };
  }

  it('flags about 5 % of perfectly clean 4 × 4 sites', () => {
    const random = generator(20_261_202);
    const normal = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
    const sites = 2000;
    let flagged = 0;
    for (let s = 0; s < sites; s++) {
      const rows = blocks.flatMap((block, b) =>
        rates.map((rate, r) => ({ block, rate, value: 100 + 3 * b + 2 * r + 5 * normal() })),
      );
      if (analyzeSite(rows).outliers.length > 0) flagged += 1;
    }
    // Common practice, no published source: a Bonferroni test at 5 % flags a clean site at most
    // 5 % of the time (union bound; 5.0 % in 20 000 simulated sites); 3.5–6.5 % is ±3 binomial SE
    // around 5 % for 2000 sites. The former |studentized residual| > 3 rule flagged 27 %.
    expect(flagged / sites).toBeGreaterThan(0.035);
    expect(flagged / sites).toBeLessThan(0.065);
  });
});
