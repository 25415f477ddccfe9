// Yield figures keep the decimals their unit needs: t/ha to two, bu/acre to one, kg/ha to none.
import { describe, expect, it } from 'vitest';
import { decimalsFor, formatNumber, squaredDecimals } from '../../../shared/reports/format-numbers';

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
