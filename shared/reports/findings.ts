// Plain-language findings for site and pooled reports, hedged the way a careful agronomist
// would say them: one field and one season never settle the question on their own.
import type {
  PooledAnalysis,
  RateDifference,
  SiteAnalysis,
  SiteDifference,
} from '../analysis/types';
import { pricePhrase, type ReportDisplayUnits } from '../units/report-units';
import {
  decimalsFor,
  formatMoney,
  formatNumber,
  formatP,
  formatVariance,
  squaredDecimals,
} from './format-numbers';
import {
  comparisonHeadline,
  farmsAgreeSentence,
  comparisonSentence,
  comparisonVerdict,
  oneSeasonCaution,
  outlierSentence,
  precisionSentence,
  signedNumber,
  type Comparison,
} from './plain-words';

/** How a rate's difference from the reference reads. */
export type DifferenceVerdict = 'clear' | 'borderline' | 'undetectable';

/** p below alpha but above this, or a gap of at least BORDERLINE_SHARE of the LSD, is "borderline". */
const BORDERLINE_P = 0.1;
const BORDERLINE_SHARE = 0.75;
/** A CV above this is high for a strip trial (Common practice, no published source). */
const HIGH_CV_PERCENT = 15;
/** Fewer sites than this cannot carry a network answer: 4–6 farms at least [PNW-V]. */
const FEW_SITES = 4;

/**
 * Sorts a difference into clear (p < alpha), borderline (p < 0.10, or the gap is at least
 * three quarters of the LSD) or undetectable.
 *
 * @param difference - the rate's difference from the reference, with its p
 * @param lsd - the least significant difference at alpha
 * @param alpha - significance level
 * @returns the verdict
 * @example classifyDifference({ diff: -2.1, p: 0.4 } as RateDifference, 4.8, 0.05) // 'undetectable'
 */
export function classifyDifference(
  difference: Pick<RateDifference, 'diff' | 'p'>,
  lsd: number,
  alpha: number,
): DifferenceVerdict {
  if (difference.p < alpha) return 'clear';
  if (difference.p < BORDERLINE_P || Math.abs(difference.diff) >= BORDERLINE_SHARE * lsd)
    return 'borderline';
  return 'undetectable';
}

/**
 * How a rate label reads in a sentence: "half" becomes "half rate", "25 kg/ha" stays.
 *
 * @example rateName('half') // 'half rate'
 */
export function rateName(label: string): string {
  const trimmed = label.trim();
  if (/rate\b/i.test(trimmed) || /\d/.test(trimmed)) return trimmed;
  return `${trimmed.toLowerCase()} rate`;
}

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);
const plural = (count: number, one: string, many = `${one}s`) =>
  `${count} ${count === 1 ? one : many}`;
const NUMBER_WORDS = [
  'no',
  'one',
  'two',
  'three',
  'four',
  'five',
  'six',
  'seven',
  'eight',
  'nine',
  'ten',
];
const countWord = (count: number) => NUMBER_WORDS[count] ?? String(count);

export interface SiteFindingsInput {
  analysis: SiteAnalysis;
  /** Display label of each rate key ("0.5" → "half"). */
  rateLabels: Readonly<Record<string, string>>;
  yieldUnit: string;
  /** Return over seed cost per rate, per acre (or hectare), when prices are known. */
  returns?: readonly { rate: string; returnOverSeedCost: number | null }[];
  prices?: { seedPricePerLb: number | null; grainPricePerBu: number | null };
  moneyUnit?: string;
  /** Prices per kg and tonne on a metric trial; per lb and bushel when absent. */
  priceUnits?: ReportDisplayUnits;
}

/** Is `rate` more seed than `reference`? Rate keys are multipliers or seeding rates. */
function sowsMore(rate: string, reference: string): boolean {
  const a = Number(rate);
  const b = Number(reference);
  return Number.isFinite(a) && Number.isFinite(b) && a > b;
}

/**
 * Each rate of a site against the reference, read from the Dunnett-adjusted interval when the
 * analysis has it (else the unadjusted one, labelled so). A gap whose unadjusted test or
 * p < 0.10 leans one way without the adjusted interval settling it is marked as a lean.
 *
 * @param analysis - the site analysis
 * @param name - how a rate key reads in a sentence ("half rate")
 * @returns one comparison per rate other than the reference
 */
export function siteComparisons(
  analysis: Pick<SiteAnalysis, 'differences' | 'reference' | 'alpha'>,
  name: (rate: string) => string,
): Comparison[] {
  return analysis.differences.map((d) => {
    const adjusted = d.ciLowAdjusted !== undefined && d.ciHighAdjusted !== undefined;
    const low = adjusted ? (d.ciLowAdjusted as number) : d.ciLow;
    const high = adjusted ? (d.ciHighAdjusted as number) : d.ciHigh;
    const settled = low > 0 || high < 0;
    return {
      rate: name(d.rate),
      reference: name(analysis.reference),
      estimate: d.diff,
      low,
      high,
      kind: adjusted ? 'dunnett' : 'unadjusted',
      level: Math.round((1 - analysis.alpha) * 100),
      moreSeed: sowsMore(d.rate, analysis.reference),
      lean: !settled && d.p < BORDERLINE_P,
    };
  });
}

/**
 * Findings for one site in plain words, for the grower: which rates clearly differed from the
 * reference and which yielded about as much (read from the Dunnett-adjusted interval, said as
 * such), what that means for the seed bag, how precise the site was, missing and odd strips,
 * the seed economics, and the reminder that one field and one season is not an answer. F, df,
 * p, LSD details and the outlier test are in siteStatisticianNotes.
 *
 * @param input - the site analysis, rate labels, yield unit and optional returns over seed cost
 * @returns sentences in reading order
 * @example siteFindings({ analysis, rateLabels: { '0.5': 'half', '1': 'full' }, yieldUnit: 'bu/acre' })[1]
 *   // 'The half rate yielded about as much as the full rate here: the difference, −1.2 bu/acre, is within what strip-to-strip variation explains (95 % interval −4.0 to +1.6 bu/acre, Dunnett-adjusted). It saved seed without a yield loss this site could detect.'
 */
export function siteFindings(input: SiteFindingsInput): string[] {
  const { analysis, yieldUnit } = input;
  const digits = decimalsFor(analysis.grandMean);
  const wording = { unit: yieldUnit, digits, scope: 'site' as const };
  const name = (rate: string) => rateName(input.rateLabels[rate] ?? `${rate}×`);
  const referenceName = name(analysis.reference);
  const comparisons = siteComparisons(analysis, name);
  const findings: string[] = [comparisonHeadline(comparisons, 'site')];
  for (const comparison of comparisons) findings.push(comparisonSentence(comparison, wording));

  findings.push(
    precisionSentence(
      {
        cvPercent: analysis.cvPercent,
        lsd: analysis.lsd,
        blocks: analysis.blocks,
        highCv: analysis.cvPercent > HIGH_CV_PERCENT,
      },
      wording,
    ),
  );

  if (analysis.missing > 0) {
    const which = analysis.missingEstimates
      .map((m) => `block ${m.block}, ${name(m.rate)}`)
      .join('; ');
    findings.push(
      `${capitalise(countWord(analysis.missing))} ${analysis.missing === 1 ? 'strip' : 'strips'} had no yield (${which}); the analysis filled ${analysis.missing === 1 ? 'it' : 'them'} in from the rest of the site, which makes the comparisons a little less certain.`,
    );
  }
  for (const outlier of analysis.outliers) {
    findings.push(
      outlierSentence(
        {
          block: outlier.block,
          rate: name(outlier.rate),
          value: outlier.value,
          pBonferroni: outlier.pBonferroni,
        },
        wording,
      ),
    );
  }

  const returns = (input.returns ?? []).filter(
    (r): r is { rate: string; returnOverSeedCost: number } => r.returnOverSeedCost !== null,
  );
  const referenceReturn = returns.find((r) => r.rate === analysis.reference);
  if (
    returns.length >= 2 &&
    referenceReturn &&
    input.prices?.grainPricePerBu &&
    input.prices.seedPricePerLb !== null
  ) {
    const best = returns.reduce((a, b) => (b.returnOverSeedCost > a.returnOverSeedCost ? b : a));
    const money = input.moneyUnit ?? '$/acre';
    const priceText = pricePhrase(input.prices, input.priceUnits);
    if (best.rate === analysis.reference) {
      findings.push(
        `With ${priceText}, the ${referenceName} gave the highest return over seed cost (${formatMoney(best.returnOverSeedCost)} ${money.replace('$/', 'per ')}).`,
      );
    } else {
      const gap = best.returnOverSeedCost - referenceReturn.returnOverSeedCost;
      const bestComparison =
        comparisons[analysis.differences.findIndex((d) => d.rate === best.rate)];
      const hedge =
        bestComparison && comparisonVerdict(bestComparison) === 'more'
          ? 'its yield gain over the reference was detectable at this site.'
          : 'the seed saving is certain, but the yield part of the gap is within what this site could not tell apart.';
      findings.push(
        `With ${priceText}, ${name(best.rate)} gave the highest return over seed cost, ${formatMoney(gap)} ${money.replace('$/', 'per ')} more than the ${referenceName}; ${hedge}`,
      );
    }
  }

  findings.push(oneSeasonCaution('site'));
  return findings;
}

/**
 * The details a statistician checks at a site, kept below the plain-word findings: the RCBD
 * ANOVA's F tests, error mean square and df, CV, LSD and Tukey's HSD, each difference's
 * one-comparison and Dunnett p, the Bonferroni outlier test on studentized residuals, and the
 * engine's notes (missing strips, too few df for Tukey).
 *
 * @param input - as siteFindings
 * @returns sentences in reading order
 */
export function siteStatisticianNotes(input: SiteFindingsInput): string[] {
  const { analysis } = input;
  const digits = decimalsFor(analysis.grandMean);
  const name = (rate: string) => input.rateLabels[rate] ?? `${rate}×`;
  const effect = (source: string) =>
    analysis.anova.find((row) => row.source === source) as
      { df: number; f?: number; p?: number } | undefined;
  const rate = effect('rate');
  const block = effect('block');
  const notes: string[] = [];
  notes.push(
    `Analysis of variance (RCBD, ${analysis.method === 'least-squares' ? 'least squares with missing strips' : 'balanced'}): rate F = ${formatNumber(rate?.f, 2)} on ${rate?.df ?? '–'} and ${analysis.errorDf} df, ${formatP(rate?.p ?? Number.NaN)}; blocks F = ${formatNumber(block?.f, 2)} on ${block?.df ?? '–'} and ${analysis.errorDf} df, ${formatP(block?.p ?? Number.NaN)}.`,
  );
  notes.push(
    `Error mean square ${formatNumber(analysis.errorMeanSquare, squaredDecimals(digits))} on ${analysis.errorDf} df; CV ${formatNumber(analysis.cvPercent, 1)} %; standard error of a difference ${formatNumber(analysis.sed, digits)}; LSD (5 %) ${formatNumber(analysis.lsd, digits)}; ${analysis.hsd === null ? 'no Tukey HSD (too few error df)' : `Tukey HSD (5 %) ${formatNumber(analysis.hsd, digits)}; rates sharing a group letter are not different by Tukey's test`}.`,
  );
  if (analysis.differences.length > 0) {
    const parts = analysis.differences.map(
      (d) =>
        `${name(d.rate)} ${signedNumber(d.diff, digits)} (t-test ${formatP(d.p)}${d.pAdjusted === undefined ? '' : `; Dunnett ${formatP(d.pAdjusted)}`})`,
    );
    notes.push(
      `Differences from the ${name(analysis.reference)} rate on ${analysis.errorDf} error df: ${parts.join('; ')}. The grower's sentences read the Dunnett-adjusted intervals, which hold for every comparison with the ${name(analysis.reference)} rate together.`,
    );
  }
  const tested = analysis.residuals.filter(
    (r): r is typeof r & { studentized: number } => r.studentized !== null,
  );
  if (tested.length > 0) {
    const largest = tested.reduce((a, b) =>
      Math.abs(b.studentized) > Math.abs(a.studentized) ? b : a,
    );
    const flagged = analysis.outliers
      .map(
        (o) =>
          `block ${o.block}, ${name(o.rate)}: studentized residual ${formatNumber(o.studentized, 2)}, Bonferroni-adjusted ${formatP(o.pBonferroni)}`,
      )
      .join('; ');
    notes.push(
      `Outlier test (externally studentized residuals on ${analysis.errorDf - 1} df, Bonferroni-adjusted over ${tested.length} strips, as R's car::outlierTest): largest |residual| ${formatNumber(Math.abs(largest.studentized), 2)} (block ${largest.block}, ${name(largest.rate)}, adjusted ${formatP(largest.pBonferroni ?? Number.NaN)}); ${flagged === '' ? `no strip flagged at ${analysis.alpha}` : `flagged: ${flagged}`}.`,
    );
  }
  notes.push(...analysis.notes);
  return notes;
}

export interface PooledFindingsInput {
  analysis: PooledAnalysis;
  rateLabels: Readonly<Record<string, string>>;
  yieldUnit: string;
  seedUnit: string;
  /** Per-site differences with each site's own LSD. */
  siteDifferences: readonly (SiteDifference & { lsd: number })[];
  sitesExcluded: readonly { name: string; reason: string }[];
  economics?: readonly {
    rate: string;
    returnOverSeedCost: number | null;
    versusReference: number | null;
  }[];
  prices?: { seedPricePerLb: number | null; grainPricePerBu: number | null };
  moneyUnit?: string;
  /** Prices per kg and tonne on a metric trial; per lb and bushel when absent. */
  priceUnits?: ReportDisplayUnits;
  seasons?: number;
}

/**
 * Each rate against the reference over the network: the mixed model's difference ("at a farm
 * like these") with its Dunnett-adjusted interval when the model was fitted, else the combined
 * analysis's difference with its unadjusted interval, labelled so.
 *
 * @param analysis - the pooled analysis
 * @param name - how a rate key reads in a sentence
 * @returns one comparison per rate other than the reference, in the order of analysis.differences
 */
export function networkComparisons(
  analysis: Pick<PooledAnalysis, 'differences' | 'mixed' | 'reference' | 'alpha'>,
  name: (rate: string) => string,
): Comparison[] {
  const level = Math.round((1 - analysis.alpha) * 100);
  return analysis.differences.map((d) => {
    const mixed = analysis.mixed?.differences.find((m) => m.rate === d.rate);
    const [estimate, low, high, p, kind] = mixed
      ? [mixed.estimate, mixed.ciLowAdjusted, mixed.ciHighAdjusted, mixed.p, 'dunnett' as const]
      : [d.diff, d.ciLow, d.ciHigh, d.p, 'unadjusted' as const];
    return {
      rate: name(d.rate),
      reference: name(analysis.reference),
      estimate,
      low,
      high,
      kind,
      level,
      moreSeed: sowsMore(d.rate, analysis.reference),
      lean: !(low > 0 || high < 0) && p < BORDERLINE_P,
    };
  });
}

/**
 * Findings for the network in plain words: how many sites, whether rate mattered more than
 * the farms disagreed, each rate against the reference with how consistent the farms were
 * ("in 6 of 8 farms the half rate did as well as the full rate"), the economic bottom line
 * per acre, the response curve's optima, and what the network could not tell. F, df,
 * Bartlett and R² are in pooledStatisticianNotes.
 *
 * @param input - the pooled analysis, labels, units, per-site differences, left-out sites and economics
 * @returns sentences in reading order
 */
export function pooledFindings(input: PooledFindingsInput): string[] {
  const { analysis, yieldUnit } = input;
  const digits = decimalsFor(analysis.grandMean);
  const wording = { unit: yieldUnit, digits, scope: 'network' as const };
  const amount = (value: number) => `${formatNumber(Math.abs(value), digits)} ${yieldUnit}`;
  const name = (rate: string) => rateName(input.rateLabels[rate] ?? `${rate}×`);
  const referenceName = name(analysis.reference);
  const findings: string[] = [];
  const sites = analysis.sites;

  const excluded = input.sitesExcluded;
  findings.push(
    excluded.length === 0
      ? `${capitalise(plural(sites, 'site'))} were analysed together.`
      : `${capitalise(plural(sites, 'site'))} were analysed together; ${plural(excluded.length, 'site was', 'sites were')} left out (${excluded.map((e) => `${e.name}: ${e.reason}`).join('; ')}).`,
  );

  const test = analysis.rateTest;
  const firstDifference = analysis.differences[0];
  const pooledLsd = firstDifference ? firstDifference.ciHigh - firstDifference.diff : Number.NaN;
  // Plain words here; the F, df and error term go to pooledStatisticianNotes.
  const mixedTest = analysis.mixed?.rateTest;
  const rateP = mixedTest?.p ?? test.p;
  findings.push(
    rateP < analysis.alpha
      ? 'Over the network, the seeding rate changed yield by more than the farms disagreed with each other about it: a difference the network can stand behind.'
      : 'Over the network, the rates did not change yield by more than the farms disagreed with each other about it: no firm difference between rates.',
  );

  const comparisons = networkComparisons(analysis, name);
  analysis.differences.forEach((difference, index) => {
    const comparison = comparisons[index]!;
    const perSite = input.siteDifferences.filter((d) => d.rate === difference.rate);
    const consistency =
      perSite.length > 0
        ? ` ${farmsAgreeSentence({
            rate: comparison.rate,
            reference: referenceName,
            within: perSite.filter((d) => d.p >= analysis.alpha).length,
            lower: perSite.filter((d) => d.p < analysis.alpha && d.diff < 0).length,
            higher: perSite.filter((d) => d.p < analysis.alpha && d.diff > 0).length,
            total: perSite.length,
          })}`
        : '';
    findings.push(comparisonSentence(comparison, wording) + consistency);
  });

  const economics = (input.economics ?? []).filter(
    (row): row is { rate: string; returnOverSeedCost: number; versusReference: number } =>
      row.returnOverSeedCost !== null && row.versusReference !== null,
  );
  if (
    economics.length >= 2 &&
    input.prices?.grainPricePerBu &&
    input.prices.seedPricePerLb !== null
  ) {
    const best = economics.reduce((a, b) => (b.returnOverSeedCost > a.returnOverSeedCost ? b : a));
    const per = (input.moneyUnit ?? '$/acre').replace('$/', 'per ');
    const priceText = pricePhrase(input.prices, input.priceUnits);
    if (best.rate === analysis.reference) {
      findings.push(
        `Bottom line: with ${priceText}, the ${referenceName} returned the most over seed cost, averaged over the sites (${formatMoney(best.returnOverSeedCost)} ${per}).`,
      );
    } else {
      const bestComparison =
        comparisons[analysis.differences.findIndex((d) => d.rate === best.rate)];
      const firm = bestComparison && comparisonVerdict(bestComparison) === 'more';
      findings.push(
        `Bottom line: with ${priceText}, ${name(best.rate)} returned ${formatMoney(best.versusReference)} ${per} more over seed cost than the ${referenceName}, averaged over the sites${firm ? '.' : '; the seed saving is certain, the yield part of it is not.'}`,
      );
    }
  }

  const curve = analysis.curve;
  if (curve) {
    const rateDigits = decimalsFor(curve.testedRange.high);
    const optimumText = (value: number | null | undefined, flag: string | undefined) =>
      value !== null && value !== undefined
        ? `${formatNumber(value, rateDigits)} ${input.seedUnit}`
        : flag === 'beyond the tested rates'
          ? 'beyond the rates tested'
          : 'not defined (the curve does not bend over)';
    let sentence = `A curve through the site means puts the highest yield at ${optimumText(curve.agronomicOptimum, curve.agronomicOptimumFlag)}`;
    if (curve.economics)
      sentence += ` and the best return over seed cost at ${optimumText(curve.economicOptimum, curve.economicOptimumFlag)}`;
    sentence += `. Curves like this are sensitive to a few sites, so read the optimum as a range around that rate, not a single number.`;
    findings.push(sentence);
  }

  const couldNot: string[] = [];
  if (Number.isFinite(pooledLsd))
    couldNot.push(
      `differences smaller than about ${amount(pooledLsd)} between rates (the smallest gap the combined analysis could detect, one comparison at a time)`,
    );
  if ((input.seasons ?? 1) <= 1)
    couldNot.push(
      'whether the answer holds in a wetter, drier or later season (this is one season)',
    );
  if (sites < FEW_SITES)
    couldNot.push(
      `how far the answer travels to other farms (only ${plural(sites, 'site')}; four to six is a usual minimum)`,
    );
  couldNot.push('which farms would gain from a change, beyond what their own site reports show');
  findings.push(`What the network could not tell: ${couldNot.join('; ')}.`);
  return findings;
}

/**
 * The details a statistician checks, kept below the plain-word findings: the classical
 * combined F against site × rate, the mixed model's Kenward–Roger F and variance components,
 * Bartlett's test of the site variances, and the curves' R² and AIC choice.
 *
 * @param input - as pooledFindings
 * @returns sentences in reading order
 */
export function pooledStatisticianNotes(input: PooledFindingsInput): string[] {
  const { analysis } = input;
  const notes: string[] = [];
  const test = analysis.rateTest;
  notes.push(
    `Combined analysis of variance: rate F = ${formatNumber(test.f, 2)} on ${test.df1} and ${test.df2} df, tested against the site × rate interaction, ${formatP(test.p)}${analysis.method === 'site-means' ? ' (on site × rate least-squares means: sites are unbalanced)' : ''}.`,
  );
  const mixed = analysis.mixed;
  if (mixed) {
    const v = mixed.varianceComponents;
    notes.push(
      `Mixed model (REML on ${mixed.observations} strips; site, block within site and site × rate random): rate F = ${formatNumber(mixed.rateTest.f, 2)} on ${mixed.rateTest.df1} and ${formatNumber(mixed.rateTest.df2, 1)} df (Kenward–Roger), ${formatP(mixed.rateTest.p)}. Variance components: site ${formatVariance(v.site)}, block within site ${formatVariance(v.blockWithinSite)}, site × rate ${formatVariance(v.siteByRate)}, residual ${formatVariance(v.residual)}.`,
    );
  }
  if (analysis.bartlett) {
    notes.push(
      `Bartlett's test of the site error variances: χ² = ${formatNumber(analysis.bartlett.chiSquare, 2)} on ${analysis.bartlett.df} df, ${formatP(analysis.bartlett.p)}${analysis.bartlett.p < analysis.alpha ? '; the noisiest sites deserve less weight when read on their own' : ''}.`,
    );
  }
  if (analysis.curve) {
    notes.push(
      `Quadratic through the site × rate means: R² = ${formatNumber(analysis.curve.rSquared, 2)} on ${analysis.curve.points} points (this R² includes the site-to-site variation).`,
    );
  }
  if (analysis.curves) {
    const models = analysis.curves.models
      .map(
        (m) =>
          `${m.model} AIC ${formatNumber(m.aic, 1)}, R² within sites ${formatNumber(m.rSquaredWithinSites, 2)}`,
      )
      .join('; ');
    notes.push(
      `Curves with site effects removed: ${models}; chosen by AIC: ${analysis.curves.chosen}. Optimum-rate intervals by the delta method.`,
    );
  }
  return notes;
}
