import { describe, expect, it } from 'vitest';
import { blocksNeeded, sitesNeeded, studentTQuantile } from '../../../shared/analysis/index';
import { readFixture } from '../helpers';

type Qt = { qt: { df: number; 'qt_0.975': number }[] };
const qt = readFixture<Qt>('r-distributions.json').qt;

describe('blocksNeeded (Cochran & Cox 1957, sec. 2.13)', () => {
  it('returns the smallest r satisfying r ≥ 2(tα/2 + tβ)²CV²/d² on the actual error df', () => {
    const result = blocksNeeded({ cvPercent: 10, difference: 15, rates: 4 });
    expect(result.errorDf).toBe((result.blocks - 1) * 3);
    expect(result.blocks).toBeGreaterThanOrEqual(
      (2 * (result.tAlpha + result.tBeta) ** 2 * 100) / 225,
    );
    // One block fewer does not satisfy the criterion at its own (smaller) df
    const dfFewer = (result.blocks - 2) * 3;
    const required =
      (2 * (studentTQuantile(0.975, dfFewer) + studentTQuantile(0.8, dfFewer)) ** 2 * 100) / 225;
    expect(result.blocks - 1).toBeLessThan(required);
    expect(() =>
      blocksNeeded({ cvPercent: 10, difference: 15, rates: 4, maxBlocks: result.blocks - 1 }),
    ).toThrow(/blocksNeeded/);
  });

  it('uses R’s t quantile on the error df', () => {
    // 4 rates, CV 10 %, d 15 %: r = 8 gives df 21; Source: R 4.2.2 qt(0.975, 20) = 2.0860 bounds qt(0.975, 21) from above
    const result = blocksNeeded({ cvPercent: 10, difference: 15, rates: 4 });
    const at20 = qt.find((row) => row.df === 20)!['qt_0.975'];
    const at24 = qt.find((row) => row.df === 24)!['qt_0.975'];
    expect(result.tAlpha).toBeLessThan(at20);
    expect(result.tAlpha).toBeGreaterThan(at24);
    // Hand check at r = 7 (df 18) with R's qt(0.975, 18): even with tβ = 0.84 (normal) 7 blocks fall short
    const t18 = qt.find((row) => row.df === 18)!['qt_0.975'];
    expect(7).toBeLessThan((2 * (t18 + 0.8416) ** 2 * 100) / 225);
    expect(result.blocks).toBe(8);
  });

  it('accepts an absolute difference with the expected mean', () => {
    expect(blocksNeeded({ cvPercent: 10, difference: 9, mean: 60, rates: 4 }).blocks).toBe(8);
  });
});

describe('sitesNeeded', () => {
  it('needs more sites when rate effects vary more among sites', () => {
    const calm = sitesNeeded({
      cvPercent: 10,
      blocksPerSite: 4,
      difference: 10,
      rates: 4,
      siteByRateCvPercent: 2,
    });
    const noisy = sitesNeeded({
      cvPercent: 10,
      blocksPerSite: 4,
      difference: 10,
      rates: 4,
      siteByRateCvPercent: 8,
    });
    expect(noisy.sites).toBeGreaterThan(calm.sites);
    const { sites, tAlpha, tBeta } = noisy;
    expect(sites).toBeGreaterThanOrEqual((2 * (tAlpha + tBeta) ** 2 * (64 + 100 / 4)) / 100);
  });
});
