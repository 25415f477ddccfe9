// The network mixed model's answers: variance components, rate test, rate means and differences.
import { fitNetworkMixedModel } from './fit-network-mixed-model';
import { summarizeMixedFit } from './summarize-mixed-fit';
import type { MixedModelAnalysis, StripObservation } from './types';

/**
 * Fits the network mixed model (see fitNetworkMixedModel: rate fixed; site, block within
 * site and site × rate random; REML) and reports, with Kenward–Roger standard errors and
 * denominator df (see summarizeMixedFit): the F test of equal rate means; each rate's mean —
 * the expected yield at a farm like these — with its CI; each rate's difference from the
 * reference with unadjusted and Dunnett-adjusted p and CI.
 *
 * Source: Kenward & Roger (1997) Biometrics 53:983–997; Halekoh & Højsgaard (2014) J. Stat.
 * Softw. 59(9); Dunnett (1955) JASA 50:1096–1121.
 *
 * @param rows - strips of every site (null = missing)
 * @param rateLevels - rate keys in order
 * @param reference - the reference rate key
 * @param alpha - 1 − confidence (default 0.05)
 * @returns the mixed-model analysis
 * @throws Error when the model cannot be fitted (see fitNetworkMixedModel)
 * @example analyzeNetworkMixedModel(rows, ['0.5', '1'], '1').rateTest.ddf // 'kenward-roger'
 */
export function analyzeNetworkMixedModel(
  rows: readonly StripObservation[],
  rateLevels: readonly string[],
  reference: string,
  alpha = 0.05,
): MixedModelAnalysis {
  const fit = fitNetworkMixedModel(rows, rateLevels);
  if (!fit.rateLevels.includes(reference))
    throw new Error(`analyzeNetworkMixedModel: reference rate ${reference} is not a rate`);
  const summary = summarizeMixedFit(fit, reference, alpha);
  const level = Math.round((1 - alpha) * 100);
  const notes: string[] = [
    'Mixed model: rate fixed; site, block within site and site × rate random; fitted by REML on every observed strip.',
    'Standard errors and degrees of freedom by Kenward–Roger.',
  ];
  const components = fit.varianceComponents;
  for (const [name, value] of Object.entries(components)) {
    if (value === 0 && name !== 'residual')
      notes.push(`The ${name} variance is estimated as zero (on the boundary).`);
  }
  return {
    method: 'REML',
    observations: fit.observations,
    sites: fit.sites,
    varianceComponents: components,
    ...summary,
    alpha,
    captions: {
      means: `Expected yield at a farm like these: each rate's mean over sites, with a ${level} % interval that allows for site-to-site differences.`,
      differences: `Difference from the reference rate (${reference}): "unadjusted" intervals and p treat each comparison on its own; "adjusted" (Dunnett) ones hold for all comparisons with the reference together.`,
    },
    notes,
  };
}
