import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('../../', import.meta.url));
const run = (...args: string[]) =>
  spawnSync(process.execPath, ['--import', 'tsx', 'api/cli/analyze.ts', ...args], {
    cwd: root,
    encoding: 'utf8',
  });

describe('analyze CLI', () => {
  it('prints the Gomez & Gomez site analysis as JSON', () => {
    const result = run('fixtures/analysis/gomez-seeding-rate.csv', '--reference', '100');
    expect(result.status).toBe(0);
    const document = JSON.parse(result.stdout);
    expect(document.response).toBe('yield');
    expect(document.reference).toBe('100');
    expect(document.pooled).toBeUndefined();
    const rate = document.sites[0].anova.find((r: { source: string }) => r.source === 'rate');
    // Source: Gomez & Gomez (1984), Table 2.6, p. 28: treatment SS 1,198,331, F 2.17
    expect(Math.round(rate.ss)).toBe(1198331);
    expect(rate.f.toFixed(2)).toBe('2.17');
  });

  it('pools two seasons with rate tested against site:rate', () => {
    const result = run('fixtures/analysis/gomez-two-seasons.csv', '--reference=0');
    expect(result.status).toBe(0);
    const { pooled, sites } = JSON.parse(result.stdout);
    expect(sites.map((s: { site: string }) => s.site)).toEqual(['dry', 'wet']);
    expect(pooled.anova.map((r: { source: string }) => r.source)).toEqual([
      'site',
      'block(site)',
      'rate',
      'site:rate',
      'error',
      'total',
    ]);
    // Source: R 4.2.2 on Gomez & Gomez (1984) p. 318 data: F = 1.9416 on 4 and 4 df
    expect(pooled.rateTest).toMatchObject({ df1: 4, df2: 4, errorTerm: 'site:rate' });
    expect(pooled.rateTest.f).toBeCloseTo(1.94157, 4);
    expect(pooled.means.map((m: { rate: string }) => m.rate)).toEqual([
      '0',
      '60',
      '90',
      '120',
      '150',
    ]);
  });

  it('prints the mixed model as pooled.mixed with Kenward–Roger df and Dunnett columns', () => {
    const result = run('fixtures/analysis/gomez-two-seasons.csv', '--reference=0');
    expect(result.status).toBe(0);
    const { pooled, sites } = JSON.parse(result.stdout);
    const mixed = pooled.mixed;
    expect(Object.keys(mixed.varianceComponents).sort()).toEqual([
      'blockWithinSite',
      'residual',
      'site',
      'siteByRate',
    ]);
    expect(mixed.rateTest.ddf).toBe('kenward-roger');
    // Source: Gomez & Gomez (1984) ch. 8.1, Table 8.4 data; R 4.2.2 pbkrtest KRmodcomp: F = 1.941573, ddf 4
    expect(mixed.rateTest.f).toBeCloseTo(1.941573, 5);
    expect(mixed.rateTest.df2).toBeCloseTo(4, 6);
    // Source: R 4.2.2 emmeans(lmer fit, ~rate, lmer.df = "kenward-roger"): SE 0.6868996
    expect(mixed.means[0].se).toBeCloseTo(0.6868996, 6);
    for (const key of ['rate', 'mean', 'se', 'df', 'ciLow', 'ciHigh'])
      expect(mixed.means[0]).toHaveProperty(key);
    for (const key of [
      'rate',
      'reference',
      'estimate',
      'se',
      'df',
      'ciLow',
      'ciHigh',
      'p',
      'pAdjusted',
      'ciLowAdjusted',
      'ciHighAdjusted',
    ])
      expect(mixed.differences[0]).toHaveProperty(key);
    // Site differences carry Dunnett-adjusted p beside the unadjusted one.
    expect(sites[0].differences[0].pAdjusted).toBeGreaterThanOrEqual(sites[0].differences[0].p);
  });

  it('analyses another response column and pools unbalanced sites by site means', () => {
    const result = run('fixtures/analysis/demo-network.csv', '--response', 'stand');
    expect(result.status).toBe(0);
    const document = JSON.parse(result.stdout);
    expect(document.response).toBe('stand');
    expect(document.reference).toBe('1');
    expect(document.pooled.method).toBe('site-means');
    // The mixed model still uses every strip of the unbalanced sites.
    expect(document.pooled.mixed.observations).toBeGreaterThan(document.pooled.sites * 4);
    const yieldRun = JSON.parse(run('fixtures/analysis/demo-network.csv').stdout);
    expect(yieldRun.response).toBe('yield');
    expect(yieldRun.sites[2].missing).toBe(1);
    expect(yieldRun.sites[2].missingEstimates).toHaveLength(1);
  });

  it('reads a semicolon-separated file with decimal commas the same as the comma file', () => {
    const source = fs.readFileSync('fixtures/analysis/gomez-seeding-rate.csv', 'utf8');
    // Yields in tonnes with a decimal comma (4 decimals: "5,113" alone is refused as ambiguous).
    const semicolons = source
      .split('\n')
      .map((line, i) => {
        if (i === 0 || line === '') return line.replaceAll(',', ';');
        const cells = line.split(',');
        const kg = Number(cells.pop());
        return [...cells, (kg / 1000).toFixed(4).replace('.', ',')].join(';');
      })
      .join('\n');
    const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'sheaf-cli-')), 'semi.csv');
    fs.writeFileSync(file, semicolons);
    const result = run(file, '--reference', '100');
    expect(result.stderr).toBe('');
    const rate = JSON.parse(result.stdout).sites[0].anova.find(
      (r: { source: string }) => r.source === 'rate',
    );
    // Source: Gomez & Gomez (1984), Table 2.6, p. 28: treatment SS 1,198,331 kg² → 1.198331 t².
    expect(rate.ss).toBeCloseTo(1.198331, 5);
    expect(rate.f.toFixed(2)).toBe('2.17');
  });

  it.each([
    ['bad-missing-column.csv', /row 1 \(header\), column "block": missing/],
    ['bad-non-numeric.csv', /row 3, column "yield": "abc": Enter a number/],
    ['bad-one-block.csv', /row 6, column "block": site "B" has only one block/],
    [
      'bad-no-yield-column.csv',
      /no "yield" column; name the response with --response \(numeric columns: plot, yld\)/,
    ],
    ['bad-negative-yield.csv', /negative value \(-3\)/],
  ])('exits 2 with a one-line message for %s', (file, message) => {
    const result = run(`fixtures/analysis/${file}`);
    expect(result.status).toBe(2);
    expect(result.stdout).toBe('');
    expect(result.stderr.trim().split('\n')).toHaveLength(1);
    expect(result.stderr).toMatch(message);
  });

  it('exits 2 for an unknown reference rate', () => {
    const result = run('fixtures/analysis/gomez-seeding-rate.csv', '--reference', '7');
    expect(result.status).toBe(2);
    expect(result.stderr).toMatch(/reference rate "7"/);
  });
});
