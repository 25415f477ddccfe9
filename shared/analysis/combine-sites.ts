// Combines per-site RCBD analyses into the pooled (over sites) analysis.
import { bartlettTest } from './bartlett-test';
import { fUpperTailP } from './f-upper-tail-p';
import { fitQuadraticResponse } from './fit-quadratic-response';
import { fitResponseModels } from './fit-response-models';
import { studentTQuantile } from './student-t-quantile';
import { studentTTwoSidedP } from './student-t-two-sided-p';
import type {
  AnovaRow,
  PooledAnalysis,
  PooledMean,
  PooledOptions,
  RateDifference,
  SiteAnalysis,
  SiteDifference,
} from './types';

const anovaSs = (analysis: SiteAnalysis, source: string): number =>
  analysis.anova.find((row) => row.source === source)?.ss ?? Number.NaN;

/**
 * Combined analysis of an RCBD repeated over sites, sites random. When every site has the
 * same blocks and no missing strip: rows site, block(site), rate, site:rate, error, total
 * (site tested against block(site); rate against site:rate; site:rate and block(site)
 * against the pooled error). Otherwise the two-way table of site × rate least-squares means
 * is analysed with site as block (method "site-means"). Rate means over sites get
 * SE = √(MS site:rate / (sites · blocks)) (÷ sites for site means) and a CI on the site:rate df.
 * Also Bartlett's test of the site error variances, per-site differences from the reference
 * and, when rates are numeric, a quadratic response over the site × rate means.
 *
 * Source: Gomez & Gomez (1984), ch. 8.1 (combined analysis over seasons/sites, Table 8.4),
 * 11.2.1 (Bartlett); McIntosh (1983) Agron. J. 75:153–155 (error terms, sites random).
 *
 * @param sites - one entry per site: its name and its analysis (same rates and reference)
 * @param rateLevels - sorted rate keys shared by every site
 * @param options - alpha, reference, numeric rates and prices
 * @returns the pooled analysis
 * @throws Error with fewer than two sites, sites with different rates, or a zero site:rate MS
 * @example combineSites(gomezSeasons, ['0', '60', '90', '120', '150']).rateTest.f // 1.9416 (R 4.2.2)
 */
export function combineSites(
  sites: readonly { site: string; analysis: SiteAnalysis }[],
  rateLevels: readonly string[],
  options: PooledOptions = {},
): PooledAnalysis {
  const alpha = options.alpha ?? 0.05;
  const count = sites.length;
  const rates = rateLevels.length;
  if (count < 2) throw new Error(`combineSites needs at least 2 sites (got ${count})`);
  const first = sites[0]!.analysis;
  const reference = first.reference;
  const table: number[][] = sites.map(({ site, analysis }) => {
    if (analysis.reference !== reference)
      throw new Error('combineSites needs one reference rate for every site');
    return rateLevels.map((rate) => {
      const mean = analysis.means.find((m) => m.rate === rate);
      if (!mean) throw new Error(`combineSites: site ${site} has no strips of rate ${rate}`);
      return mean.mean;
    });
  });
  if (sites.some(({ analysis }) => analysis.means.length !== rates)) {
    throw new Error('combineSites: every site must have the same rates');
  }
  const notes: string[] = [
    'Sites are taken as random: rate is tested against the site × rate interaction.',
  ];
  const balanced = sites.every(
    ({ analysis }) => analysis.missing === 0 && analysis.blocks === first.blocks,
  );
  const blocks = balanced ? first.blocks : 1;
  const siteMeans = table.map((row) => row.reduce((a, b) => a + b, 0) / rates);
  const rateMeans = rateLevels.map(
    (_, i) => table.reduce((sum, row) => sum + (row[i] as number), 0) / count,
  );
  const grandMean = siteMeans.reduce((a, b) => a + b, 0) / count;
  let ssSite = 0;
  for (const mean of siteMeans) ssSite += rates * blocks * (mean - grandMean) ** 2;
  let ssRate = 0;
  for (const mean of rateMeans) ssRate += count * blocks * (mean - grandMean) ** 2;
  const dfSite = count - 1;
  const dfRate = rates - 1;
  const dfInteraction = dfSite * dfRate;
  let anova: AnovaRow[];
  let ssInteraction: number;
  if (balanced) {
    const ssBlocks = sites.reduce((sum, { analysis }) => sum + anovaSs(analysis, 'block'), 0);
    const ssRateWithin = sites.reduce((sum, { analysis }) => sum + anovaSs(analysis, 'rate'), 0);
    const ssError = sites.reduce((sum, { analysis }) => sum + anovaSs(analysis, 'error'), 0);
    ssInteraction = Math.max(0, ssRateWithin - ssRate);
    const dfBlocks = count * (blocks - 1);
    const dfError = sites.reduce((sum, { analysis }) => sum + analysis.errorDf, 0);
    const msBlocks = ssBlocks / dfBlocks;
    const msError = ssError / dfError;
    const msInteraction = ssInteraction / dfInteraction;
    const fSite = ssSite / dfSite / msBlocks;
    const fBlocks = msBlocks / msError;
    const fInteraction = msInteraction / msError;
    const fRate = ssRate / dfRate / msInteraction;
    anova = [
      {
        source: 'site',
        df: dfSite,
        ss: ssSite,
        ms: ssSite / dfSite,
        f: fSite,
        p: fUpperTailP(fSite, dfSite, dfBlocks),
      },
      {
        source: 'block(site)',
        df: dfBlocks,
        ss: ssBlocks,
        ms: msBlocks,
        f: fBlocks,
        p: fUpperTailP(fBlocks, dfBlocks, dfError),
      },
      {
        source: 'rate',
        df: dfRate,
        ss: ssRate,
        ms: ssRate / dfRate,
        f: fRate,
        p: safeP(fRate, dfRate, dfInteraction),
      },
      {
        source: 'site:rate',
        df: dfInteraction,
        ss: ssInteraction,
        ms: msInteraction,
        f: fInteraction,
        p: fUpperTailP(fInteraction, dfInteraction, dfError),
      },
      { source: 'error', df: dfError, ss: ssError, ms: msError },
      {
        source: 'total',
        df: count * blocks * rates - 1,
        ss: ssSite + ssBlocks + ssRate + ssInteraction + ssError,
      },
    ];
  } else {
    let ssTotal = 0;
    for (const row of table) for (const value of row) ssTotal += (value - grandMean) ** 2;
    ssInteraction = Math.max(0, ssTotal - ssSite - ssRate);
    const msInteraction = ssInteraction / dfInteraction;
    const fSite = ssSite / dfSite / msInteraction;
    const fRate = ssRate / dfRate / msInteraction;
    anova = [
      {
        source: 'site',
        df: dfSite,
        ss: ssSite,
        ms: ssSite / dfSite,
        f: fSite,
        p: safeP(fSite, dfSite, dfInteraction),
      },
      {
        source: 'rate',
        df: dfRate,
        ss: ssRate,
        ms: ssRate / dfRate,
        f: fRate,
        p: safeP(fRate, dfRate, dfInteraction),
      },
      { source: 'site:rate', df: dfInteraction, ss: ssInteraction, ms: msInteraction },
      { source: 'total', df: count * rates - 1, ss: ssTotal },
    ];
    notes.push(
      'Sites differ in number of blocks or have missing strips, so the pooled analysis uses each site’s rate means (least-squares means) with site as block; the site × rate mean square is the error.',
    );
  }
  const msInteraction = ssInteraction / dfInteraction;
  if (!(msInteraction > 0))
    throw new Error('combineSites: the site × rate mean square is zero; rates cannot be tested');
  const rateRow = anova.find((row) => row.source === 'rate') as { f: number; p: number };
  const tCritical = studentTQuantile(1 - alpha / 2, dfInteraction);
  const seMean = Math.sqrt(msInteraction / (count * blocks));
  const means: PooledMean[] = rateLevels.map((rate, i) => {
    const mean = rateMeans[i] as number;
    const n = sites.reduce((sum, { analysis }) => sum + (analysis.means[i]?.n ?? 0), 0);
    return {
      rate,
      n,
      mean,
      se: seMean,
      ciLow: mean - tCritical * seMean,
      ciHigh: mean + tCritical * seMean,
    };
  });
  const referenceIndex = rateLevels.indexOf(reference);
  const seDifference = Math.SQRT2 * seMean;
  const differences: RateDifference[] = [];
  rateLevels.forEach((rate, i) => {
    if (i === referenceIndex) return;
    const diff = (rateMeans[i] as number) - (rateMeans[referenceIndex] as number);
    differences.push({
      rate,
      diff,
      se: seDifference,
      ciLow: diff - tCritical * seDifference,
      ciHigh: diff + tCritical * seDifference,
      p: studentTTwoSidedP(diff / seDifference, dfInteraction),
    });
  });
  const siteDifferences: SiteDifference[] = [];
  for (const { site, analysis } of sites) {
    for (const difference of analysis.differences) siteDifferences.push({ site, ...difference });
  }
  const pooled: PooledAnalysis = {
    sites: count,
    method: balanced ? 'combined' : 'site-means',
    anova,
    rateTest: {
      f: rateRow.f,
      df1: dfRate,
      df2: dfInteraction,
      p: rateRow.p,
      errorTerm: 'site:rate',
    },
    grandMean,
    reference,
    alpha,
    means,
    differences,
    siteDifferences,
    notes,
  };
  try {
    pooled.bartlett = bartlettTest(
      sites.map(({ analysis }) => analysis.errorMeanSquare),
      sites.map(({ analysis }) => analysis.errorDf),
    );
  } catch (error) {
    notes.push(`Bartlett's test not computed: ${(error as Error).message}`);
  }
  const numeric = rateLevels.map(
    (rate) => options.ratesNumeric?.[rate] ?? (rate.trim() === '' ? Number.NaN : Number(rate)),
  );
  if (numeric.every((x) => Number.isFinite(x))) {
    const points = table.flatMap((row) =>
      row.map((value, i) => ({ rate: numeric[i] as number, value })),
    );
    try {
      pooled.curve = fitQuadraticResponse(points, options.prices);
      notes.push('Response curve fitted to the site × rate means.');
    } catch (error) {
      notes.push(`Response curve not fitted: ${(error as Error).message}`);
    }
    try {
      const ratio = options.prices
        ? options.prices.seedPricePerRateUnit / options.prices.grainPricePerYieldUnit
        : undefined;
      pooled.curves = fitResponseModels(
        sites.flatMap(({ site }, s) =>
          numeric.map((rate, i) => ({ site, rate, value: table[s]![i]! })),
        ),
        ratio,
        alpha,
      );
    } catch (error) {
      notes.push(`Curves with site effects removed not fitted: ${(error as Error).message}`);
    }
  } else {
    notes.push('Response curve not fitted: rates are not numeric (pass ratesNumeric).');
  }
  return pooled;
}

function safeP(f: number, df1: number, df2: number): number {
  return Number.isFinite(f) ? fUpperTailP(f, df1, df2) : 0;
}
