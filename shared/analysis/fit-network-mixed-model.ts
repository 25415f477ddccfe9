// REML fit of the network mixed model: rate fixed; site, block within site and site × rate random.
import { fitNestedMixedModel, type NestedMixedModelFit } from './fit-nested-mixed-model';
import type { StripObservation } from './types';

/** Result of fitting y = rate + site + block(site) + site:rate + error by REML. */
export type MixedModelFit = Omit<NestedMixedModelFit, 'components' | 'seasons'> & {
  varianceComponents: {
    site: number;
    blockWithinSite: number;
    siteByRate: number;
    residual: number;
  };
};

/**
 * Fits the linear mixed model of a trial network by restricted maximum likelihood (REML):
 * rate as fixed effect (one mean per rate); site, block within site and site × rate as
 * independent random effects; independent strip errors. Every observed strip is used, so
 * sites may differ in blocks and miss strips. The engine (fitNestedMixedModel) is shared with
 * the series model, which adds season and season × rate; here there is no season level.
 *
 * Source: Patterson & Thompson (1971) Biometrika 58:545–554 (REML); Kenward, M.G. &
 * Roger, J.H. (1997) Biometrics 53:983–997; Halekoh & Højsgaard (2014) J. Stat. Softw. 59(9)
 * (pbkrtest formulas); Smith, Cullis & Thompson (2005) J. Agric. Sci. 143:449–462 (mixed
 * models for multi-environment variety trials).
 *
 * @param rows - strips (site, block, rate, value; null = missing, left out)
 * @param rateLevels - rates to estimate, in order (default: every rate seen, sorted)
 * @returns variance components, rate means with Φ and Φ_A, and a Kenward–Roger test function
 * @throws Error with fewer than 2 sites, a rate without data, non-finite values, or when REML
 *   does not converge
 * @example fitNetworkMixedModel(rows).varianceComponents.siteByRate // REML σ² of site × rate (R: lmer)
 */
export function fitNetworkMixedModel(
  rows: readonly StripObservation[],
  rateLevels?: readonly string[],
): MixedModelFit {
  const {
    components,
    seasons: _seasons,
    ...fit
  } = fitNestedMixedModel(rows, {
    ...(rateLevels ? { rateLevels } : {}),
    seasonLevel: false,
    caller: 'fitNetworkMixedModel',
  });
  return {
    ...fit,
    varianceComponents: {
      site: components[0]!,
      blockWithinSite: components[1]!,
      siteByRate: components[2]!,
      residual: components[3]!,
    },
  };
}
