// Plain-words sentences for growers: what a comparison means, what to act on and how sure the
// trial is, with every number saying what it is. The site report, the network report, the
// meeting view, the PDF and the strip warnings all read these, so the wording is the same.
import { formatNumber, formatP } from './format-numbers';

/** Where a sentence speaks about: one grower's field, or the network's farms together. */
export type Scope = 'site' | 'network';

/** Which interval a number comes with. */
export type IntervalKind = 'dunnett' | 'unadjusted';

/** How a rate compared with the reference, read from its interval. */
export type ComparisonVerdict = 'more' | 'less' | 'same';

/** One rate against the reference rate, as the sentence builders need it. */
export interface Comparison {
  /** The rate as a sentence names it ("half rate"). */
  rate: string;
  /** The reference rate as a sentence names it ("full rate"). */
  reference: string;
  /** This rate's mean minus the reference's, in the yield unit. */
  estimate: number;
  /** The interval of the estimate. */
  low: number;
  high: number;
  kind: IntervalKind;
  /** Confidence level in per cent (default 95). */
  level?: number;
  /** True when this rate sows more seed than the reference. */
  moreSeed: boolean;
  /**
   * True when the gap leans one way without the interval settling it (taken alone it would
   * count, or p is below 0.10): said as a hint to check, never as a result.
   */
  lean?: boolean;
}

/** Yield unit, decimals and scope of the sentences. */
export interface Wording {
  unit: string;
  digits: number;
  scope: Scope;
}

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

/**
 * A signed number with a true minus sign; "0.0" stays unsigned.
 *
 * @example signedNumber(-1.23, 1) // '−1.2'
 */
export function signedNumber(value: number, digits: number): string {
  const text = formatNumber(Math.abs(value), digits);
  if (Number(text.replace(/,/g, '')) === 0) return text;
  return value < 0 ? `−${text}` : `+${text}`;
}

/**
 * Reads a comparison from its interval: "more" or "less" when the whole interval is on one side
 * of zero, "same" when it holds zero (no difference the trial could detect).
 *
 * @example comparisonVerdict({ low: -4, high: 1.6 } as Comparison) // 'same'
 */
export function comparisonVerdict(comparison: Pick<Comparison, 'low' | 'high'>): ComparisonVerdict {
  if (comparison.low > 0) return 'more';
  if (comparison.high < 0) return 'less';
  return 'same';
}

/**
 * What an interval is, in words: "Dunnett-adjusted" (holds for every rate compared with the
 * reference together) or "this comparison alone, not adjusted".
 *
 * @example intervalKindWords('dunnett') // 'Dunnett-adjusted'
 */
export function intervalKindWords(kind: IntervalKind): string {
  return kind === 'dunnett' ? 'Dunnett-adjusted' : 'this comparison alone, not adjusted';
}

/**
 * The interval of a comparison with its level, unit and kind.
 *
 * @example intervalText({ low: -4, high: 1.6, kind: 'dunnett' } as Comparison, { unit: 'bu/acre', digits: 1, scope: 'site' })
 *   // '95 % interval −4.0 to +1.6 bu/acre, Dunnett-adjusted'
 */
export function intervalText(
  comparison: Pick<Comparison, 'low' | 'high' | 'kind' | 'level'>,
  wording: Wording,
): string {
  const level = comparison.level ?? 95;
  return `${level} % interval ${signedNumber(comparison.low, wording.digits)} to ${signedNumber(comparison.high, wording.digits)} ${wording.unit}, ${intervalKindWords(comparison.kind)}`;
}

const WHERE = { site: 'here', network: 'on average across the farms' } as const;
const NOISE = {
  site: 'what strip-to-strip variation explains',
  network: 'what the differences between farms explain',
} as const;
const BEYOND = {
  site: 'strip-to-strip variation explains',
  network: 'the differences between farms explain',
} as const;
const DETECT = { site: 'this site', network: 'the network' } as const;

/** What a grower can take from the comparison: the action, hedged by how sure we are. */
function actionWords(comparison: Comparison, verdict: ComparisonVerdict, scope: Scope): string {
  const field = scope === 'site' ? 'on this field' : 'across the network';
  if (verdict === 'same') {
    if (comparison.lean)
      return `The gap leans one way but is not settled: treat it as a hint to check ${scope === 'site' ? 'against the other sites' : 'in another season'}, not as a result.`;
    return comparison.moreSeed
      ? `The extra seed bought no yield gain ${DETECT[scope]} could detect.`
      : `It saved seed without a yield loss ${DETECT[scope]} could detect.`;
  }
  if (verdict === 'less')
    return comparison.moreSeed
      ? `Sowing more seed than the ${comparison.reference} cost yield ${field}.`
      : `Cutting seed to the ${comparison.rate} cost yield ${field}.`;
  return comparison.moreSeed
    ? `Weigh that gain against the cost of the extra seed (see the return over seed cost).`
    : `It saved seed and still yielded more ${field}.`;
}

/**
 * One rate against the reference in plain words: what happened, how sure (within or beyond
 * what the variation explains, with the interval and which interval it is) and what it means
 * for the seed bag.
 *
 * @param comparison - the rate, the reference, the difference and its interval
 * @param wording - unit, decimals and whether this is one site or the network
 * @returns one or two sentences
 * @example comparisonSentence({ rate: 'half rate', reference: 'full rate', estimate: -1.2, low: -4, high: 1.6, kind: 'dunnett', moreSeed: false }, { unit: 'bu/acre', digits: 1, scope: 'site' })
 *   // 'The half rate yielded about as much as the full rate here: the difference, −1.2 bu/acre, is within what strip-to-strip variation explains (95 % interval −4.0 to +1.6 bu/acre, Dunnett-adjusted). It saved seed without a yield loss this site could detect.'
 */
export function comparisonSentence(comparison: Comparison, wording: Wording): string {
  const verdict = comparisonVerdict(comparison);
  const { scope, unit, digits } = wording;
  const interval = intervalText(comparison, wording);
  const action = actionWords(comparison, verdict, scope);
  const subject = `The ${comparison.rate}`;
  if (verdict === 'same') {
    return `${subject} yielded about as much as the ${comparison.reference} ${WHERE[scope]}: the difference, ${signedNumber(comparison.estimate, digits)} ${unit}, is within ${NOISE[scope]} (${interval}). ${action}`;
  }
  return `${subject} yielded ${verdict} than the ${comparison.reference} ${WHERE[scope]}: ${formatNumber(Math.abs(comparison.estimate), digits)} ${unit} ${verdict}, more than ${BEYOND[scope]} (${interval}). ${action}`;
}

/**
 * The short form for a slide or a table cell: the verdict and the number with its interval.
 *
 * @example comparisonLine({ rate: 'half rate', reference: 'full rate', estimate: -1.2, low: -4, high: 1.6, kind: 'dunnett', moreSeed: false }, { unit: 'bu/acre', digits: 1, scope: 'network' })
 *   // 'Half rate: about as much as the full rate (−1.2 bu/acre; 95 % interval −4.0 to +1.6 bu/acre, Dunnett-adjusted).'
 */
export function comparisonLine(comparison: Comparison, wording: Wording): string {
  return `${capitalise(comparison.rate)}: ${verdictWords(comparisonVerdict(comparison), comparison.reference)} (${signedNumber(comparison.estimate, wording.digits)} ${wording.unit}; ${intervalText(comparison, wording)}).`;
}

/**
 * A verdict in a few words, for tables and short lines.
 *
 * @example verdictWords('less', 'full rate') // 'clearly less than the full rate'
 */
export function verdictWords(verdict: ComparisonVerdict, reference: string): string {
  if (verdict === 'same') return `about as much as the ${reference}`;
  return `clearly ${verdict} than the ${reference}`;
}

/**
 * The headline of a site or network: which rates clearly differed from the reference and which
 * yielded about as much, with no test statistics.
 *
 * @param comparisons - every rate against the reference
 * @param scope - one site or the network
 * @returns one sentence
 * @example comparisonHeadline([half, quarter], 'site')
 *   // 'At this site the quarter rate yielded clearly less than the full rate; the half rate yielded about as much as the full rate.'
 */
export function comparisonHeadline(comparisons: readonly Comparison[], scope: Scope): string {
  const where = scope === 'site' ? 'At this site' : 'Across the network';
  const reference = comparisons[0]?.reference ?? 'reference rate';
  const clear = comparisons.filter((c) => comparisonVerdict(c) !== 'same');
  const same = comparisons.filter((c) => comparisonVerdict(c) === 'same');
  if (clear.length === 0)
    return `${where} no rate yielded detectably differently from the ${reference}: every gap was within ${NOISE[scope]}.`;
  const clauses = clear.map(
    (c, i) =>
      `the ${c.rate} yielded clearly ${comparisonVerdict(c)}${i === 0 ? ` than the ${reference}` : ''}`,
  );
  const lead = `${where} ${joinWords(clauses)}`;
  if (same.length === 0) return `${lead}.`;
  return `${lead}; the ${joinWords(same.map((c) => c.rate))} yielded about as much as the ${reference}.`;
}

/**
 * How many farms agreed with the network answer for one rate.
 *
 * @example farmsAgreeSentence({ rate: 'half rate', reference: 'full rate', within: 6, lower: 2, higher: 0, total: 8 })
 *   // 'In 6 of 8 farms the half rate did as well as the full rate (no difference that farm’s own strips could detect); it did detectably worse at two and detectably better at none.'
 */
export function farmsAgreeSentence(input: {
  rate: string;
  reference: string;
  within: number;
  lower: number;
  higher: number;
  total: number;
}): string {
  return `In ${input.within} of ${input.total} farms the ${input.rate} did as well as the ${input.reference} (no difference that farm’s own strips could detect); it did detectably worse at ${countWords(input.lower)} and detectably better at ${countWords(input.higher)}.`;
}

/**
 * How precise a site was, in words: how much strips sown alike varied and the smallest gap
 * between two rates the site could pick out (the least significant difference, LSD, at 5 %).
 *
 * @example precisionSentence({ cvPercent: 6.2, lsd: 4.8, blocks: 4 }, { unit: 'bu/acre', digits: 1, scope: 'site' })
 *   // 'Strips sown alike varied by about 6.2 % (CV); with 4 blocks this site could pick out a difference of about 4.8 bu/acre or more between two rates (least significant difference, 5 %, one comparison).'
 */
export function precisionSentence(
  input: { cvPercent: number; lsd: number; blocks: number; highCv?: boolean },
  wording: Wording,
): string {
  const sentence = `Strips sown alike varied by about ${formatNumber(input.cvPercent, 1)} % (CV); with ${input.blocks} block${input.blocks === 1 ? '' : 's'} this site could pick out a difference of about ${formatNumber(input.lsd, wording.digits)} ${wording.unit} or more between two rates (least significant difference, 5 %, one comparison).`;
  return input.highCv
    ? `${sentence} That is a lot of variation for a strip trial, so only large differences could show up.`
    : sentence;
}

/**
 * What a grower reads when too few strips have a yield to compare rates.
 *
 * @example notEnoughDataSentence({ withYield: 5, strips: 16 })
 *   // 'Only 5 of 16 strips have a yield so far: too few to compare the rates at this site yet. Once every rate has a yield in at least two blocks, this report says what the strips show.'
 */
export function notEnoughDataSentence(input: { withYield: number; strips: number }): string {
  return `Only ${input.withYield} of ${input.strips} strips have a yield so far: too few to compare the rates at this site yet. Once every rate has a yield in at least two blocks, this report says what the strips show.`;
}

/**
 * The reminder that one season (and, at a site, one field) can mislead.
 *
 * @param scope - one site, or the network
 * @param seasons - seasons behind the answer (the network's caution names them)
 * @returns one sentence
 */
export function oneSeasonCaution(scope: Scope, seasons = 1): string {
  if (scope === 'site')
    return 'This is one field in one season. Weather, soil and seed lot change from year to year, so read this result alongside the other sites in the network before changing how much seed you sow.';
  if (seasons > 1)
    return `This answer pools ${seasons} seasons; a season unlike these can still turn out differently, so keep local extension advice and the seed label first.`;
  return 'This is one season. Whether the answer holds in a wetter, drier or later year needs the trial again next season, before anyone changes rates on every field.';
}

/**
 * Why a strip is flagged, in words, with the Bonferroni-adjusted p of the outlier test
 * (externally studentized residual, as R's `car::outlierTest`).
 *
 * @example outlierReason(0.012) // 'further from what its block and rate predict than chance explains, even allowing for checking every strip (outlier test, Bonferroni-adjusted p = 0.012)'
 */
export function outlierReason(pBonferroni: number): string {
  return `further from what its block and rate predict than chance explains, even allowing for checking every strip (outlier test, Bonferroni-adjusted ${formatP(pBonferroni)})`;
}

/**
 * A flagged strip in a report, with what to check.
 *
 * @example outlierSentence({ block: '3', rate: 'full rate', value: 82.1, pBonferroni: 0.012 }, { unit: 'bu/acre', digits: 1, scope: 'site' })
 *   // 'The strip in block 3 at the full rate (82.1 bu/acre) is further from …: it stays in the analysis; check its weight, moisture and harvested area before leaning on it.'
 */
export function outlierSentence(
  strip: { block: string; rate: string; value: number; pBonferroni: number },
  wording: Wording,
): string {
  return `The strip in block ${strip.block} at the ${strip.rate} (${formatNumber(strip.value, wording.digits)} ${wording.unit}) is ${outlierReason(strip.pBonferroni)}: it stays in the analysis; check its weight, moisture and harvested area before leaning on it.`;
}

const NUMBER_WORDS = [
  'none',
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

/** A small count in words ("none", "two"), larger ones as digits. */
export function countWords(count: number): string {
  return NUMBER_WORDS[count] ?? String(count);
}

/** "a", "a and b", "a, b and c". */
export function joinWords(items: readonly string[]): string {
  if (items.length <= 1) return items[0] ?? '';
  return `${items.slice(0, -1).join(', ')} and ${items.at(-1)}`;
}
