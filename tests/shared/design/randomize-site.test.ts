import { describe, expect, it } from 'vitest';
import { chiSquareUpperTailP } from '../../../shared/analysis';
import { randomizeRcbd } from '../../../shared/design/randomize-rcbd';
import { randomizeSite } from '../../../shared/design/randomize-site';

const RATES = ['quarter', 'half', 'full', 'double'] as const;

describe('randomizeSite', () => {
  it('puts every rate exactly once in every block of every site', () => {
    for (let site = 0; site < 200; site += 1) {
      const map = randomizeSite(RATES, 4, `site-${site}`);
      expect(map).toHaveLength(4);
      for (const block of map) expect([...block].sort()).toEqual([...RATES].sort());
    }
  });

  it('gives the same map for the same seed', () => {
    expect(randomizeSite(RATES, 6, 'millbrook-7')).toEqual(randomizeSite(RATES, 6, 'millbrook-7'));
  });

  it('gives different maps for different sites (seeds)', () => {
    const maps = new Set(
      Array.from({ length: 200 }, (_, i) => JSON.stringify(randomizeSite(RATES, 4, `site-${i}`))),
    );
    // 24^4 ≈ 330,000 equally likely maps: 200 seeds should all differ.
    expect(maps.size).toBe(200);
  });

  it('never repeats a block order within a site when there are enough orders', () => {
    for (let site = 0; site < 500; site += 1) {
      const map = randomizeSite(RATES, 6, `distinct-${site}`);
      expect(new Set(map.map((b) => b.join())).size).toBe(6);
    }
  });

  it('allows repeats only when there are more blocks than orders', () => {
    const map = randomizeSite(['a', 'b'], 4, 'two-rates');
    for (const block of map) expect([...block].sort()).toEqual(['a', 'b']);
  });

  it('matches randomizeRcbd for a seed whose blocks are all different already', () => {
    const seed = Array.from({ length: 100 }, (_, i) => `same-${i}`).find(
      (s) => new Set(randomizeRcbd(RATES, 4, s).map((b) => b.join())).size === 4,
    )!;
    expect(randomizeSite(RATES, 4, seed)).toEqual(randomizeRcbd(RATES, 4, seed));
  });

  it('draws every order of the rates about equally often (chi-square, fixed seeds)', () => {
    // Each site's first block is one draw from the 4! = 24 orders, independent between sites, so
    // a goodness-of-fit test over the 24 orders has 23 df (uniform orders also mean each rate
    // lands in each position equally often). The last block checks that redrawing repeated
    // orders does not bias later blocks. Seeds are fixed ('site-0' … 'site-4799'), so the
    // outcome is deterministic: it changes only when the randomizer changes.
    // Source: NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.6.7.4 "Critical values of the
    // chi-square distribution": upper 5 % point for 23 df = 35.172.
    const sites = 4800;
    for (const blockIndex of [0, 3]) {
      const counts = new Map<string, number>();
      const positionCounts = [0, 1, 2, 3].map(() => RATES.map(() => 0));
      for (let site = 0; site < sites; site += 1) {
        const order = randomizeSite(RATES, 4, `site-${site}`)[blockIndex]!;
        counts.set(order.join(), (counts.get(order.join()) ?? 0) + 1);
        order.forEach((rate, position) => {
          positionCounts[position]![RATES.indexOf(rate)]! += 1;
        });
      }
      expect(counts.size).toBe(24);
      const expected = sites / 24;
      const statistic = [...counts.values()].reduce(
        (sum, observed) => sum + (observed - expected) ** 2 / expected,
        0,
      );
      expect(statistic).toBeLessThan(35.172);
      expect(chiSquareUpperTailP(statistic, 23)).toBeGreaterThan(0.05);
      // And plainly: each rate sits in each position within 10 % of a quarter of the time.
      for (const byRate of positionCounts)
        for (const n of byRate) expect(Math.abs(n / (sites / 4) - 1)).toBeLessThan(0.1);
    }
  });

  it('throws for no rates, duplicate rates or zero blocks', () => {
    expect(() => randomizeSite([], 4, 's')).toThrow(/at least one/);
    expect(() => randomizeSite(['a', 'a'], 4, 's')).toThrow(/distinct/);
    expect(() => randomizeSite(['a', 'b'], 0, 's')).toThrow(/blocks/);
  });
});
