// Plain-language findings for site and pooled reports, hedged the way a careful agronomist
// would say them: one field and one season never settle the question on their own.
import type {
  PooledAnalysis,
  RateDifference,
  SiteAnalysis,
  SiteDifference,
} from '../analysis/types';
import { pricePhrase, type ReportDisplayUnits } from '../units/report-units';
import { decimalsFor, formatMoney, formatNumber, formatP } from './format-numbers';

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
const siteCount = (count: number) => (count === 0 ? 'none' : countWord(count));

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

/**
 * Findings for one site: the overall rate test, each rate against the reference with the
 * site's LSD as the yardstick, how precise the site was, missing strips and odd strips,
 * the seed economics, and the reminder that one field and one season is not an answer.
 *
 * @param input - the site analysis, rate labels, yield unit and optional returns over seed cost
 * @returns sentences in reading order
 * @example siteFindings({ analysis, rateLabels: { '0.5': 'half', '1': 'full' }, yieldUnit: 'bu/acre' })[1]
 *   // 'Half rate yielded within 2.1 bu/acre of the full rate; the difference is smaller than this site could detect (LSD 4.8).'
 */
export function siteFindings(input: SiteFindingsInput): string[] {
  const { analysis, yieldUnit } = input;
  const digits = decimalsFor(analysis.grandMean);
  const amount = (value: number) => `${formatNumber(Math.abs(value), digits)} ${yieldUnit}`;
  const name = (rate: string) => rateName(input.rateLabels[rate] ?? `${rate}×`);
  const referenceName = name(analysis.reference);
  const lsdText = formatNumber(analysis.lsd, digits);
  const findings: string[] = [];

  const rateRow = analysis.anova.find((row) => row.source === 'rate') as { p?: number } | undefined;
  const rateP = rateRow?.p ?? Number.NaN;
  const verdicts = analysis.differences.map((d) => ({
    difference: d,
    verdict: classifyDifference(d, analysis.lsd, analysis.alpha),
  }));
  const anyClear = verdicts.some((v) => v.verdict === 'clear');
  if (rateP < analysis.alpha) {
    findings.push(
      `Seeding rate made a difference to yield at this site that is larger than the strip-to-strip variation (${formatP(rateP)}).`,
    );
  } else if (!anyClear) {
    findings.push(
      `At this site the rates did not yield detectably differently: the gaps between rates were no larger than the differences between strips sown alike (${formatP(rateP)}).`,
    );
  } else {
    findings.push(
      `Taken all together the rates were not clearly different (${formatP(rateP)}), although one comparison with the ${referenceName} stands out below; read it with care.`,
    );
  }

  for (const { difference, verdict } of verdicts) {
    const rate = capitalise(name(difference.rate));
    const direction = difference.diff < 0 ? 'less' : 'more';
    if (verdict === 'clear') {
      const low = Math.min(Math.abs(difference.ciLow), Math.abs(difference.ciHigh));
      const high = Math.max(Math.abs(difference.ciLow), Math.abs(difference.ciHigh));
      findings.push(
        `${rate} yielded ${amount(difference.diff)} ${direction} than the ${referenceName} (95 % confidence interval ${formatNumber(low, digits)} to ${formatNumber(high, digits)} ${direction}); that is more than this site could put down to chance (LSD ${lsdText}).`,
      );
    } else if (verdict === 'borderline') {
      findings.push(
        `${rate} yielded ${amount(difference.diff)} ${direction} than the ${referenceName}, close to the smallest difference this site could detect (LSD ${lsdText}, ${formatP(difference.p)}); treat it as a hint to check against other sites, not as a result.`,
      );
    } else {
      findings.push(
        `${rate} yielded within ${amount(difference.diff)} of the ${referenceName}; the difference is smaller than this site could detect (LSD ${lsdText}).`,
      );
    }
  }

  const precision = `Strips sown alike varied by ${formatNumber(analysis.cvPercent, 1)} % (CV); with ${plural(analysis.blocks, 'block')} this site could tell apart rates about ${amount(analysis.lsd)} apart or more.`;
  findings.push(
    analysis.cvPercent > HIGH_CV_PERCENT
      ? `${precision} That is a lot of variation for a strip trial, so only large differences could show up.`
      : precision,
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
      `The strip in block ${outlier.block} at ${name(outlier.rate)} (${amount(outlier.value)}) is far from what its block and rate predict; check its weight and harvested area before leaning on it.`,
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
      const bestVerdict = verdicts.find((v) => v.difference.rate === best.rate)?.verdict;
      const hedge =
        bestVerdict === 'clear'
          ? 'its yield gain over the reference was detectable at this site.'
          : 'the seed saving is certain, but the yield part of the gap is within what this site could not tell apart.';
      findings.push(
        `With ${priceText}, ${name(best.rate)} gave the highest return over seed cost, ${formatMoney(gap)} ${money.replace('$/', 'per ')} more than the ${referenceName}; ${hedge}`,
      );
    }
  }

  findings.push(
    'This is one field in one season. Weather, soil and seed lot change from year to year, so read this result alongside the other sites in the network before changing how much seed you sow.',
  );
  return findings;
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

  for (const difference of analysis.differences) {
    const rate = name(difference.rate);
    const verdict = classifyDifference(difference, pooledLsd, analysis.alpha);
    const direction = difference.diff < 0 ? 'less' : 'more';
    const ci = `95 % CI ${formatSigned(difference.ciLow, digits)} to ${formatSigned(difference.ciHigh, digits)}`;
    const lead =
      verdict === 'clear'
        ? `${capitalise(rate)} yielded ${amount(difference.diff)} ${direction} than the ${referenceName} on average (${ci}), a difference the network can stand behind.`
        : verdict === 'borderline'
          ? `${capitalise(rate)} yielded ${amount(difference.diff)} ${direction} than the ${referenceName} on average (${ci}, ${formatP(difference.p)}): a lean, not a firm answer.`
          : `${capitalise(rate)} yielded within ${amount(difference.diff)} of the ${referenceName} on average (${ci}); the network could not tell them apart.`;
    const perSite = input.siteDifferences.filter((d) => d.rate === difference.rate);
    const within = perSite.filter((d) => d.p >= analysis.alpha).length;
    const lower = perSite.filter((d) => d.p < analysis.alpha && d.diff < 0).length;
    const higher = perSite.filter((d) => d.p < analysis.alpha && d.diff > 0).length;
    const consistency =
      perSite.length > 0
        ? ` In ${within} of ${perSite.length} farms the ${rate} did as well as the ${referenceName} (no difference that farm's strips could detect); it did detectably worse at ${siteCount(lower)} and detectably better at ${siteCount(higher)}.`
        : '';
    findings.push(lead + consistency);
  }

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
      const bestDifference = analysis.differences.find((d) => d.rate === best.rate);
      const firm = bestDifference && bestDifference.p < analysis.alpha;
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
    couldNot.push(`differences smaller than about ${amount(pooledLsd)} between rates`);
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
      `Mixed model (REML on ${mixed.observations} strips; site, block within site and site × rate random): rate F = ${formatNumber(mixed.rateTest.f, 2)} on ${mixed.rateTest.df1} and ${formatNumber(mixed.rateTest.df2, 1)} df (Kenward–Roger), ${formatP(mixed.rateTest.p)}. Variance components: site ${formatNumber(v.site, 3)}, block within site ${formatNumber(v.blockWithinSite, 3)}, site × rate ${formatNumber(v.siteByRate, 3)}, residual ${formatNumber(v.residual, 3)}.`,
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

function formatSigned(value: number, digits: number): string {
  const text = formatNumber(Math.abs(value), digits);
  if (Number(text.replace(/,/g, '')) === 0) return text;
  return value < 0 ? `−${text}` : `+${text}`;
}
