// Pools the trials of a series across seasons and sets each season beside the pool.
import { analyzeNetworkMixedModel } from './analyze-network-mixed-model';
import { fitSeriesMixedModel } from './fit-series-mixed-model';
import { normalizeRate } from './normalize-rate';
import { summarizeMixedFit } from './summarize-mixed-fit';
import type {
  SeriesAnalysis,
  SeriesConsistency,
  SeriesMixedModelAnalysis,
  SeriesSeason,
  SeriesStripObservation,
} from './types';

const COMPONENT_WORDS: Record<string, string> = {
  season: 'season',
  seasonByRate: 'season × rate',
  siteSeason: 'site-season',
  blockWithinSiteSeason: 'block within site-season',
  siteSeasonByRate: 'site-season × rate',
};

/**
 * The series analysis: the series mixed model over every site-season (see
 * fitSeriesMixedModel: rate fixed; season, season × rate, site-season, block within
 * site-season and site-season × rate random; REML, Kenward–Roger), each season's own network
 * mixed model beside it (the same model its trial's pooled report shows), and how consistent
 * the rate effect is across seasons: the season × rate variance beside the site-season × rate
 * variance, and per rate in how many seasons it did as well as the reference (that season's
 * unadjusted difference not detectable at α). Seasons with one site get raw means only.
 *
 * Source: Piepho, Möhring, Melchinger & Büchse (2008) Euphytica 161:209–228 (series of trials
 * over years and locations); Kenward & Roger (1997) Biometrics 53:983–997; Dunnett (1955)
 * JASA 50:1096–1121.
 *
 * @param rows - strips with their season
 * @param rateLevels - rate keys in order
 * @param reference - the reference rate key
 * @param alpha - 1 − confidence (default 0.05)
 * @returns the pooled model (null with a note when it cannot be fitted), seasons and consistency
 * @throws Error when the reference is not one of the rates
 * @example analyzeSeries(rows, ['0.5', '1'], '1').consistency?.perRate[0].asWell // seasons where ½ did as well
 */
export function analyzeSeries(
  rows: readonly SeriesStripObservation[],
  rateLevels: readonly string[],
  reference: string,
  alpha = 0.05,
): SeriesAnalysis {
  const levels = rateLevels.map((rate) => normalizeRate(rate));
  const referenceKey = normalizeRate(reference);
  if (!levels.includes(referenceKey))
    throw new Error(`analyzeSeries: reference rate ${reference} is not a rate`);
  const notes: string[] = [];
  const seasonNames = [...new Set(rows.map((row) => row.season))].sort();
  const seasons = seasonNames.map((season) =>
    analyzeSeason(
      season,
      rows.filter((row) => row.season === season),
      levels,
      referenceKey,
      alpha,
    ),
  );
  let pooled: SeriesMixedModelAnalysis | null = null;
  try {
    pooled = pooledModel(rows, levels, referenceKey, alpha);
  } catch (error) {
    notes.push(`Series model not fitted: ${(error as Error).message}`);
  }
  const consistency: SeriesConsistency | null = pooled
    ? {
        seasonByRate: pooled.varianceComponents.seasonByRate,
        siteSeasonByRate: pooled.varianceComponents.siteSeasonByRate,
        seasonShare:
          pooled.varianceComponents.seasonByRate + pooled.varianceComponents.siteSeasonByRate > 0
            ? pooled.varianceComponents.seasonByRate /
              (pooled.varianceComponents.seasonByRate + pooled.varianceComponents.siteSeasonByRate)
            : null,
        perRate: levels
          .filter((rate) => rate !== referenceKey)
          .map((rate) => {
            const verdicts = seasons.flatMap((season) => {
              const difference = season.mixed?.differences.find((d) => d.rate === rate);
              return difference ? [difference] : [];
            });
            return {
              rate,
              seasons: verdicts.length,
              asWell: verdicts.filter((d) => d.p >= alpha).length,
              worse: verdicts.filter((d) => d.p < alpha && d.estimate < 0).length,
              better: verdicts.filter((d) => d.p < alpha && d.estimate > 0).length,
            };
          }),
      }
    : null;
  return {
    reference: referenceKey,
    rateLevels: levels,
    alpha,
    pooled,
    seasons,
    consistency,
    notes,
  };
}

function pooledModel(
  rows: readonly SeriesStripObservation[],
  levels: readonly string[],
  reference: string,
  alpha: number,
): SeriesMixedModelAnalysis {
  const fit = fitSeriesMixedModel(rows, levels);
  const summary = summarizeMixedFit(fit, reference, alpha);
  const components = fit.varianceComponents;
  const boundary = Object.entries(components)
    .filter(([name, value]) => name !== 'residual' && value === 0)
    .map(([name]) => name);
  const level = Math.round((1 - alpha) * 100);
  const notes = [
    'Series model: rate fixed; season, season × rate, site-season, block within site-season and site-season × rate random; fitted by REML on every observed strip.',
    'Standard errors and degrees of freedom by Kenward–Roger.',
    ...boundary.map(
      (name) =>
        `The ${COMPONENT_WORDS[name]} variance is estimated as zero (on the boundary: a singular fit, as lme4 reports it); with few seasons it is weakly estimated, and zero means "too small to see in these seasons", not "none".`,
    ),
  ];
  return {
    method: 'REML',
    observations: fit.observations,
    seasons: fit.seasons,
    siteSeasons: fit.sites,
    varianceComponents: components,
    boundary,
    ...summary,
    alpha,
    captions: {
      means: `Expected yield at a farm like these in a season like these: each rate's mean over farms and seasons, with a ${level} % interval that allows for farm-to-farm and season-to-season differences.`,
      differences: `Difference from the reference rate (${reference}) over the seasons: "unadjusted" intervals and p treat each comparison on its own; "adjusted" (Dunnett) ones hold for all comparisons with the reference together.`,
    },
    notes,
  };
}

function analyzeSeason(
  season: string,
  rows: readonly SeriesStripObservation[],
  levels: readonly string[],
  reference: string,
  alpha: number,
): SeriesSeason {
  const observed = rows.filter((row) => row.value !== null);
  const sites = new Set(observed.map((row) => row.site)).size;
  const rawMeans = levels.map((rate) => {
    const values = observed
      .filter((row) => normalizeRate(row.rate) === rate)
      .map((row) => row.value as number);
    return {
      rate,
      mean: values.length ? values.reduce((a, b) => a + b, 0) / values.length : null,
      strips: values.length,
    };
  });
  const result: SeriesSeason = {
    season,
    sites,
    observations: observed.length,
    rawMeans,
    mixed: null,
  };
  try {
    result.mixed = analyzeNetworkMixedModel(rows, levels, reference, alpha);
  } catch (error) {
    result.note = `This season's own mixed model was not fitted: ${(error as Error).message}`;
  }
  return result;
}
