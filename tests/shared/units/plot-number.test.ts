import { describe, expect, it } from 'vitest';
import { plotNumber } from '../../../shared/units/plot-number';

describe('plotNumber', () => {
  it('numbers plots block × 100 + position, unique within a site', () => {
    // Common practice, no published source: replicated field trials stake plots 101, 102 … 201 ….
    expect(plotNumber(1, 1)).toBe(101);
    expect(plotNumber(2, 3)).toBe(203);
    const all = [1, 2, 3, 4].flatMap((b) => [1, 2, 3, 4, 5, 6, 7, 8].map((p) => plotNumber(b, p)));
    expect(new Set(all).size).toBe(all.length);
  });

  it('throws for a position past 99 or a block below 1', () => {
    expect(() => plotNumber(1, 100)).toThrow(/position/);
    expect(() => plotNumber(0, 1)).toThrow(/block/);
  });
});
