// The series report body: every site-season pooled, each season beside the pool, plain words first.
import { analyzeSeries } from '../analysis/analyze-series';
import { chooseReferenceRate } from '../analysis/choose-reference-rate';
import { sortRateLevels } from '../analysis/sort-rate-levels';
import type { SeriesStripObservation } from '../analysis/types';
import type { SeriesReport } from '../schemas/series';
import { rateName } from './findings';
import { decimalsFor, formatNumber } from './format-numbers';

/** One season of the series: its trial, its rate labels and the sites that can be pooled. */
export interface SeriesSeasonInput {
  season: string;
  trialId: string;
  trialName: string;
  rates: readonly { key: string; label: string }[];
  sites: readonly {
    name: string;
    rows: readonly { block: string; rate: string; value: number | null }[];
  }[];
  leftOut: readonly { name: string; reason: string }[];
}

export interface SeriesReportInput {
  series: { id: string; name: string; crop: SeriesReport['series']['crop']; cropName: string };
  unit: string;
  seasons: readonly SeriesSeasonInput[];
}

type Body = Omit<SeriesReport, 'unpublishedTrials' | 'canLink'>;

const COMPONENT_LABELS: Record<string, string> = {
  season: 'season (all rates up or down together)',
  seasonByRate: 'season × rate (the rate effect changing from season to season)',
  siteSeason: 'farm in a season',
  blockWithinSiteSeason: 'block within a farm',
  siteSeasonByRate: 'farm × rate (the rate effect changing from farm to farm)',
  residual: 'strip to strip (residual)',
};

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

/**
 * Builds the series report from the seasons' strips: the series mixed model (analyzeSeries),
 * a table of each rate's pooled "expected yield at a farm like these" beside each season's own
 * mean, the differences from the reference with how many seasons agreed, plain-words findings
 * first and the statistics (variance components, F, df) for the statistician below.
 *
 * Source: Piepho, Möhring, Melchinger & Büchse (2008) Euphytica 161:209–228 (series of trials).
 *
 * @param input - series facts, yield unit and each season's sites
 * @returns the report body (without the caller's permissions)
 * @throws never for bad data: what cannot be fitted becomes a note
 * @example buildSeriesReport(input).findings[0] // 'Two seasons, 14 farm-seasons ...'
 */
export function buildSeriesReport(input: SeriesReportInput): Body {
  const seasons = [...input.seasons].sort((a, b) => a.season.localeCompare(b.season));
  // Rates every season tested: a rate missing from a season cannot say how consistent it was.
  const common = sortRateLevels(
    [...new Set(seasons.flatMap((s) => s.rates.map((r) => r.key)))].filter((key) =>
      seasons.every((s) => s.rates.some((r) => r.key === key)),
    ),
  );
  const labels = new Map<string, string>();
  for (const season of seasons) for (const r of season.rates) labels.set(r.key, r.label);
  const notes: string[] = [];
  const dropped = [...labels.keys()].filter((key) => !common.includes(key));
  if (dropped.length > 0)
    notes.push(
      `Rates not tested in every season are left out of the series: ${dropped.map((k) => labels.get(k)).join(', ')}.`,
    );
  const rows: SeriesStripObservation[] = seasons.flatMap((season) =>
    season.sites.flatMap((site) =>
      site.rows
        .filter((row) => common.includes(row.rate))
        .map((row) => ({ season: season.season, site: site.name, ...row })),
    ),
  );
  const reference =
    common.length > 0
      ? chooseReferenceRate(
          common,
          common.map(() => 1),
        )
      : '1';
  const label = (rate: string) => labels.get(rate) ?? `${rate}×`;
  const name = (rate: string) => rateName(label(rate));
  const analysis =
    common.length >= 2 && common.includes(reference)
      ? analyzeSeries(rows, common, reference)
      : null;
  if (!analysis) notes.push('The seasons share fewer than two rates: nothing to pool.');
  const pooled = analysis?.pooled ?? null;
  const seasonAnalyses = seasons.map(
    (season) => analysis?.seasons.find((s) => s.season === season.season) ?? null,
  );
  const values = rows.flatMap((r) => (r.value === null ? [] : [r.value]));
  const digits = decimalsFor(values.length ? values.reduce((a, b) => a + b, 0) / values.length : 1);
  const amount = (value: number) => `${formatNumber(Math.abs(value), digits)} ${input.unit}`;
  const level = Math.round((1 - (analysis?.alpha ?? 0.05)) * 100);

  const means = common.map((rate) => {
    const mean = pooled?.means.find((m) => m.rate === rate);
    return {
      rate,
      label: label(rate),
      pooled: mean ? { mean: mean.mean, ciLow: mean.ciLow, ciHigh: mean.ciHigh } : null,
      seasons: seasonAnalyses.map((s) => {
        const own = s?.mixed?.means.find((m) => m.rate === rate);
        return own ? own.mean : (s?.rawMeans.find((m) => m.rate === rate)?.mean ?? null);
      }),
    };
  });
  const perRate = analysis?.consistency?.perRate ?? [];
  const differences = (pooled?.differences ?? []).map((d) => {
    const agreement = perRate.find((r) => r.rate === d.rate);
    return {
      rate: d.rate,
      label: label(d.rate),
      estimate: d.estimate,
      ciLow: d.ciLow,
      ciHigh: d.ciHigh,
      p: d.p,
      ciLowAdjusted: d.ciLowAdjusted,
      ciHighAdjusted: d.ciHighAdjusted,
      pAdjusted: d.pAdjusted,
      seasons: seasonAnalyses.map(
        (s) => s?.mixed?.differences.find((own) => own.rate === d.rate)?.estimate ?? null,
      ),
      asWell: agreement?.asWell ?? 0,
      compared: agreement?.seasons ?? 0,
    };
  });

  const findings: string[] = [];
  const farmSeasons = seasons.reduce((sum, s) => sum + s.sites.length, 0);
  findings.push(
    `${capitalise(countWord(seasons.length, 'season'))} (${seasons.map((s) => s.season).join(', ')}) and ${countWord(farmSeasons, 'farm-season')} were pooled: each farm in each season counts once, and both the farms and the seasons are allowed to differ.`,
  );
  if (pooled) {
    findings.push(
      pooled.rateTest.p < pooled.alpha
        ? 'Over all seasons, the seeding rate changed yield by more than the farms and seasons disagreed about it: a difference the series can stand behind.'
        : 'Over all seasons, the rates did not change yield by more than the farms and seasons disagreed about it: no firm difference between rates.',
    );
    for (const d of differences) {
      const ci = `${level} % interval ${signed(d.ciLow, digits)} to ${signed(d.ciHigh, digits)}`;
      const lead =
        d.p < pooled.alpha
          ? `${capitalise(name(d.rate))} yielded ${amount(d.estimate)} ${d.estimate < 0 ? 'less' : 'more'} than the ${name(reference)} over the seasons (${ci}).`
          : `${capitalise(name(d.rate))} yielded within ${amount(d.estimate)} of the ${name(reference)} over the seasons (${ci}); the series could not tell them apart.`;
      const agreement =
        d.compared > 0
          ? ` The ${name(d.rate)} did as well as the ${name(reference)} in ${d.asWell} of ${d.compared} seasons (no difference that season's farms could detect).`
          : '';
      findings.push(lead + agreement);
    }
    findings.push(consistencySentence(pooled.varianceComponents, seasons.length));
    const referenceMean = pooled.means.find((m) => m.rate === reference);
    if (referenceMean && seasons.length < 4)
      findings.push(
        `The yield to expect from any rate next season is much less sure than the differences between rates (the ${name(reference)}: ${formatNumber(referenceMean.ciLow, digits)} to ${formatNumber(referenceMean.ciHigh, digits)} ${input.unit}, ${level} % interval): a season lifts or lowers every rate together, and ${countWord(seasons.length, 'season')} say little about how far. That swing cancels out of the differences, which is why they are much narrower.`,
      );
  } else if (analysis) {
    notes.push(...analysis.notes);
  }
  if (seasons.length < 3)
    findings.push(
      `${capitalise(countWord(seasons.length, 'season'))} ${seasons.length === 1 ? 'is' : 'are'} a start, not a climate: another season (wetter, drier or later) would show whether the answer holds.`,
    );

  return {
    series: input.series,
    unit: input.unit,
    reference,
    findings,
    seasons: seasons.map((season, index) => ({
      season: season.season,
      trialId: season.trialId,
      trialName: season.trialName,
      sites: season.sites.length,
      leftOut: [...season.leftOut],
      note: seasonAnalyses[index]?.note ?? null,
    })),
    means: {
      caption: `Expected yield at a farm like these in a season like these (${input.unit}): the series mixed model's mean over every farm and season, with a ${level} % interval that allows for farm-to-farm and season-to-season differences.`,
      seasonCaption: `Each season's column is that season's own mean over its farms (the same mixed model its trial's pooled report uses; a plain strip average when a season has one farm). No interval: read the pooled column for how sure the series is.`,
      rows: means,
    },
    differences: {
      caption: `Difference from the ${name(reference)} (${input.unit}): pooled over the seasons, with the ${level} % interval of each comparison on its own ("unadjusted") and the Dunnett-adjusted interval that holds for all comparisons with the ${name(reference)} together; each season's own difference beside it.`,
      rows: differences,
    },
    statistician: {
      varianceComponents: pooled
        ? Object.entries(pooled.varianceComponents).map(([key, value]) => ({
            name: key,
            label: COMPONENT_LABELS[key] ?? key,
            value,
          }))
        : [],
      rateTest: pooled
        ? {
            f: pooled.rateTest.f,
            df1: pooled.rateTest.df1,
            df2: pooled.rateTest.df2,
            p: pooled.rateTest.p,
          }
        : null,
      seasonTests: seasonAnalyses.flatMap((s) =>
        s?.mixed
          ? [
              {
                season: s.season,
                f: s.mixed.rateTest.f,
                df1: s.mixed.rateTest.df1,
                df2: s.mixed.rateTest.df2,
                p: s.mixed.rateTest.p,
              },
            ]
          : [],
      ),
      notes: [...(pooled?.notes ?? []), ...notes],
    },
  };
}

function countWord(count: number, one: string): string {
  const words = ['no', 'one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine'];
  return `${words[count] ?? count} ${count === 1 ? one : `${one}s`}`;
}

function signed(value: number, digits: number): string {
  return `${value < 0 ? '−' : '+'}${formatNumber(Math.abs(value), digits)}`;
}

/** How consistent the rate effect was across seasons, from σ² season × rate beside σ² farm × rate. */
function consistencySentence(
  components: { seasonByRate: number; siteSeasonByRate: number },
  seasons: number,
): string {
  const { seasonByRate, siteSeasonByRate } = components;
  if (seasonByRate === 0)
    return `The rate effect did not change from season to season by more than the farms' own differences could hide (the season-to-season part is estimated as zero; with ${countWord(seasons, 'season')} that means "too small to see", not "none").`;
  const share = seasonByRate / (seasonByRate + siteSeasonByRate);
  if (share < 0.25)
    return `The rate effect changed a little from season to season, much less than from farm to farm (${Math.round(share * 100)} % of the rate effect's variation is between seasons).`;
  if (share < 0.6)
    return `The rate effect changed from season to season about as much as from farm to farm (${Math.round(share * 100)} % of its variation is between seasons): read each season's column, not only the pool.`;
  return `The rate effect changed more from season to season than from farm to farm (${Math.round(share * 100)} % of its variation is between seasons): the season matters, so read each season's column before acting on the pool.`;
}
