// groupedDecimal writes numbers as Intl.NumberFormat('en') does, without loading locale data.
import { describe, expect, it } from 'vitest';
import { groupedDecimal, onFirstUse } from '../../../shared/labels/decimal-text';
import { countOf } from '../../../shared/labels/labels';

// Source: ECMA-402 (Intl.NumberFormat, rounding mode "halfExpand" on the number's shortest decimal
// form), as implemented by the ICU library that Node ships: the text the app showed before.
// One formatter per number of decimals: making one per value took most of this file's time.
const referenceFormats = [0, 1, 2, 3].map(
  (decimals) =>
    new Intl.NumberFormat('en', {
      minimumFractionDigits: decimals,
      maximumFractionDigits: decimals,
    }),
);

describe('groupedDecimal', () => {
  it('gives the same text as Intl.NumberFormat for field-sized values, halves and negatives', () => {
    const values: number[] = [0, -0, 0.05, 0.15, 1.45, 2.675, 1.005, -1.45, -0.04, 999.95, 1234.5];
    for (let k = -2500; k <= 250_000; k += 7) values.push(k / 100, k / 1000, k * 13.37);
    // Mismatches collected and compared once: an expect() per value would take seconds.
    const mismatches: string[] = [];
    for (const value of values)
      for (const [decimals, format] of referenceFormats.entries()) {
        const written = groupedDecimal(value, decimals);
        const expected = format.format(value);
        if (written !== expected)
          mismatches.push(`${value} to ${decimals}: ${written} ≠ ${expected}`);
      }
    expect(values.length).toBeGreaterThan(100_000);
    expect(mismatches.slice(0, 10)).toEqual([]);
  });

  it('rounds a typed half up, where binary rounding would go down', () => {
    // 1.45 is 1.4499999999999999556 in binary: toFixed(1) gives "1.4", a person reads "1.5".
    expect((1.45).toFixed(1)).toBe('1.4');
    expect(groupedDecimal(1.45, 1)).toBe('1.5');
    expect(groupedDecimal(1_234_567.891, 2)).toBe('1,234,567.89');
  });
});

describe('onFirstUse', () => {
  it('makes the value once, when first asked for', () => {
    let made = 0;
    const formatter = onFirstUse(() => ({ serial: ++made }));
    expect(made).toBe(0);
    expect(formatter()).toBe(formatter());
    expect(made).toBe(1);
  });
});

describe('countOf', () => {
  it('writes a count as toLocaleString does, whole or with a fraction, and picks the word', () => {
    // Source: ECMA-402 Number.prototype.toLocaleString('en') (up to 3 decimals), via Node's ICU.
    for (const count of [0, 1, 2, 12.5, 1234, 1_234_567, 10.125])
      expect(countOf(count, 'turn')).toBe(
        `${count.toLocaleString('en')} ${count === 1 ? 'turn' : 'turns'}`,
      );
    expect(countOf(1, 'check')).toBe('1 check');
  });
});
