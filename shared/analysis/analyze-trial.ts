// Whole-trial analysis: every site, and the pooled analysis when there are two or more.
import { analyzeSite } from './analyze-site';
import { addMixedModel } from './add-mixed-model';
import { combineSites } from './combine-sites';
import { groupBySite } from './group-by-site';
import type { StripObservation, TrialAnalysis, TrialOptions } from './types';

/**
 * Analyses a trial for one response: each site as an RCBD (see analyzeSite) with one shared
 * reference rate, plus the pooled analysis over sites (see analyzePooled) when there are at
 * least two sites. This is the document the command-line tool prints.
 *
 * Source: Gomez & Gomez (1984), ch. 2.2 and 8.1.
 *
 * @param rows - strips (site, block, rate, value; null = missing)
 * @param options - response name (label only, default "yield"), reference, alpha,
 *   ratesNumeric and prices
 * @returns response, reference, per-site analyses and the pooled analysis
 * @throws Error naming the site when a site cannot be analysed
 * @example analyzeTrial(rows, { response: 'yield' }).sites[0].anova[1].source // 'rate'
 */
export function analyzeTrial(
  rows: readonly StripObservation[],
  options: TrialOptions = {},
): TrialAnalysis {
  const { sites, rateLevels, reference } = groupBySite(rows, options.reference);
  const analyses = sites.map(({ site, rows: siteRows }) => {
    try {
      return {
        site,
        analysis: analyzeSite(siteRows, {
          reference,
          alpha: options.alpha,
          manyToOne: options.manyToOne ?? true,
        }),
      };
    } catch (error) {
      throw new Error(`site ${site}: ${(error as Error).message}`);
    }
  });
  const result: TrialAnalysis = {
    response: options.response ?? 'yield',
    reference,
    sites: analyses.map(({ site, analysis }) => ({ site, ...analysis })),
  };
  if (analyses.length >= 2) {
    result.pooled = combineSites(analyses, rateLevels, { ...options, reference });
    addMixedModel(result.pooled, rows, rateLevels, reference, options.alpha);
  }
  return result;
}
