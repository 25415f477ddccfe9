// Shared test helpers: significant-figure comparison and the reference fixtures.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { expect } from 'vitest';

/** Asserts that actual equals expected to `figures` significant figures. */
export function expectFigures(actual: number, expected: number, figures = 6): void {
  const tolerance = Math.abs(expected) * 10 ** -figures + 1e-12;
  expect(Math.abs(actual - expected), `${actual} vs ${expected}`).toBeLessThanOrEqual(tolerance);
}

export function readFixture<T>(name: string): T {
  const path = fileURLToPath(new URL(`../../fixtures/reference/${name}`, import.meta.url));
  return JSON.parse(readFileSync(path, 'utf8')) as T;
}

export type AnovaReference = {
  source: string;
  df: number;
  ss: number;
  ms?: number;
  F?: number | null;
  p?: number | null;
};

export type GomezSeedRate = {
  data: { block: string; rate: string; value: number }[];
  publishedTable2_6: Record<string, number>;
  r: {
    anova: AnovaReference[];
    grandMean: number;
    cvPercent: number;
    seMean: number;
    sed: number;
    tCritical: number;
    lsd: number;
    qCritical: number;
    hsd: number;
    means: {
      treatment: string;
      n: number;
      mean: number;
      se_mean_pooled: number;
      ci95_lower_pooled: number;
      ci95_upper_pooled: number;
    }[];
    pairwise: {
      level_a: string;
      level_b: string;
      diff_a_minus_b: number;
      p_lsd_unadjusted: number;
      'significant_lsd_0.05': boolean;
      'significant_tukey_0.05': boolean;
    }[];
  };
  quadraticPlotLevel: {
    coefficients: { term: string; estimate: number; se: number }[];
    rSquared: number;
    rateMaxYield: number;
    economic: {
      seed_price_usd_per_kg_seed: number;
      grain_price_usd_per_kg_grain: number;
      rate_economic_optimum: number;
    };
  };
};

export type GomezSeasons = {
  data: { site: string; block: string; rate: string; value: number }[];
  r: {
    anova: AnovaReference[];
    grandMean: number;
    seMean: number;
    means: { treatment: string; mean: number; lower: number; upper: number }[];
    bartlett: { chi_square: number; df: number; p: number };
    perSiteErrorMs: Record<string, number>;
    perSiteDryPairwise: {
      level_a: string;
      level_b: string;
      diff_a_minus_b: number;
      sed: number;
      p_lsd_unadjusted: number;
    }[];
  };
  publishedTable8_4Variant: {
    changedCell: { site: string; rate: string; block: string; value: number };
    seasonSs: number;
    repsWithinSeasonSs: number;
    nitrogenSs: number;
    seasonByNitrogenSs: number;
    pooledErrorSs: number;
    nitrogenFvsPooledError: number;
    seasonByNitrogenF: number;
  };
};
