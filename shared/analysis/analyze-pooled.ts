// Pooled (over sites) analysis of a seeding-rate trial network.
import { analyzeSite } from './analyze-site';
import { addMixedModel } from './add-mixed-model';
import { combineSites } from './combine-sites';
import { groupBySite } from './group-by-site';
import type { PooledAnalysis, PooledOptions, StripObservation } from './types';

/**
 * Analyses every site as an RCBD and combines them, sites random (see combineSites): combined
 * ANOVA (or site-means analysis when sites are unbalanced), rate F against site:rate, rate
 * means over sites with CI, Bartlett's test, per-site differences from the reference, and a
 * quadratic response curve with agronomic/economic optima when rates are numeric.
 *
 * Source: Gomez & Gomez (1984), ch. 8.1 and Table 8.4.
 *
 * @param rows - strips of two or more sites
 * @param options - reference (default "1", else the most-observed middle level), alpha,
 *   numeric value of each rate key for the curve, and prices for the economic optimum
 * @returns the pooled analysis
 * @throws Error when there are fewer than two sites or any site cannot be analysed
 * @example analyzePooled(gomezWetDryRows).rateTest.f // 1.9416 (R 4.2.2, Gomez & Gomez 1984 Table 8.4 data)
 */
export function analyzePooled(
  rows: readonly StripObservation[],
  options: PooledOptions = {},
): PooledAnalysis {
  const { sites, rateLevels, reference } = groupBySite(rows, options.reference);
  if (sites.length < 2)
    throw new Error(`analyzePooled needs at least 2 sites (got ${sites.length})`);
  const analyses = sites.map(({ site, rows: siteRows }) => ({
    site,
    analysis: withSite(site, () =>
      analyzeSite(siteRows, { reference, alpha: options.alpha, manyToOne: options.manyToOne }),
    ),
  }));
  const pooled = combineSites(analyses, rateLevels, { ...options, reference });
  addMixedModel(pooled, rows, rateLevels, reference, options.alpha);
  return pooled;
}

function withSite<T>(site: string, run: () => T): T {
  try {
    return run();
  } catch (error) {
    throw new Error(`site ${site}: ${(error as Error).message}`);
  }
}
