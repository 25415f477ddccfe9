// Yield figures keep the decimals their unit needs: t/ha to two, bu/acre to one, kg/ha to none.
import { describe, expect, it } from 'vitest';
import {
  decimalsFor,
  formatNumber,
  formatVariance,
  squaredDecimals,
} from '../../../shared/reports/format-numbers';

describe('yield decimals', () => {
  it('shows t/ha with two decimals and its mean squares with four', () => {
    // Common practice, no published source: metric yields are quoted as 4.52 t/ha.
    const digits = decimalsFor(4.5234);
    expect(digits).toBe(2);
    expect(formatNumber(4.5234, digits)).toBe('4.52');
    // Source: NIST SP 811 (2008 ed.), Appendix B.8 / SI: 1 t = 1000 kg, so a mean square of
    // 110,558 (kg/ha)² is 0.110 558 (t/ha)²; four decimals keep three of its figures.
    expect(formatNumber(110_558 / 1000 ** 2, squaredDecimals(digits))).toBe('0.1106');
  });

  it('leaves bu/acre (one decimal) and kg/ha (none) as they were', () => {
    // Common practice, no published source.
    expect(decimalsFor(62.4)).toBe(1);
    expect(squaredDecimals(1)).toBe(1);
    expect(decimalsFor(4960)).toBe(0);
    expect(squaredDecimals(0)).toBe(0);
  });
});

describe('variance components', () => {
  it('keep three significant figures in either unit, so a small one never reads 0.000', () => {
    // Source: NIST SP 811 (2008 ed.), Appendix B.8 / SI: 1 t = 1000 kg, so a variance of
    // 4,321 (kg/ha)² is 0.004 321 (t/ha)²; the same three figures show in both units.
    expect(formatVariance(4321)).toBe('4,320');
    expect(formatVariance(4321 / 1000 ** 2)).toBe('0.00432');
    expect(formatVariance(51_234.5)).toBe('51,200');
    expect(formatVariance(0.1234)).toBe('0.123');
    expect(formatVariance(12.345)).toBe('12.3');
    // A boundary fit (REML puts a component at zero) says 0, and a missing one a dash.
    expect(formatVariance(0)).toBe('0');
    expect(formatVariance(null)).toBe('–');
  });
});
