// REML fit of the series mixed model: trials of one crop across seasons, pooled.
import { fitNestedMixedModel, type NestedMixedModelFit } from './fit-nested-mixed-model';
import type { SeriesMixedModelAnalysis, SeriesStripObservation } from './types';

/** Result of fitting the series model by REML. */
export type SeriesMixedModelFit = Omit<NestedMixedModelFit, 'components'> & {
  varianceComponents: SeriesMixedModelAnalysis['varianceComponents'];
};

/**
 * Fits the mixed model of a series of trials across seasons by REML: rate fixed; season,
 * season × rate, site-season (one grower's field in one season), block within site-season
 * and site-season × rate random; independent strip errors:
 * y = rate + season + season:rate + siteSeason + block(siteSeason) + siteSeason:rate + error,
 * as R's `lmer(y ~ 0 + rate + (1|season) + (1|season:rate) + (1|siteSeason) +
 * (1|siteSeason:block) + (1|siteSeason:rate))`. The season × rate variance says how much the
 * rate effect moves from season to season, beside how much it moves from farm to farm
 * (site-season × rate). With few seasons it is weakly estimated and may sit at zero (a
 * boundary, "singular" fit, kept there as lme4 does).
 *
 * Source: Patterson & Thompson (1971) Biometrika 58:545–554 (REML); Kenward & Roger (1997)
 * Biometrics 53:983–997; Smith, Cullis & Thompson (2005) J. Agric. Sci. 143:449–462 (series
 * of trials across environments); Piepho, Möhring, Melchinger & Büchse (2008) Euphytica
 * 161:209–228 (mixed models for series of trials over years and locations).
 *
 * @param rows - strips with their season (site names need only be unique within a season)
 * @param rateLevels - rates to estimate, in order (default: every rate seen, sorted)
 * @returns variance components, rate means with Φ and Φ_A, and a Kenward–Roger test function
 * @throws Error with fewer than 2 seasons or 2 site-seasons, a rate without data, non-finite
 *   values, or when REML does not converge
 * @example fitSeriesMixedModel(rows).varianceComponents.seasonByRate // REML σ² of season × rate (R: lmer)
 */
export function fitSeriesMixedModel(
  rows: readonly SeriesStripObservation[],
  rateLevels?: readonly string[],
): SeriesMixedModelFit {
  const { components, ...fit } = fitNestedMixedModel(rows, {
    ...(rateLevels ? { rateLevels } : {}),
    seasonLevel: true,
    caller: 'fitSeriesMixedModel',
  });
  return {
    ...fit,
    varianceComponents: {
      season: components[4]!,
      seasonByRate: components[5]!,
      siteSeason: components[0]!,
      blockWithinSiteSeason: components[1]!,
      siteSeasonByRate: components[2]!,
      residual: components[3]!,
    },
  };
}
