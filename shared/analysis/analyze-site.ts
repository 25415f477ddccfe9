// Analysis of one site: RCBD ANOVA, rate means, comparisons, missing strips and outliers.
import { adjustManyToOne } from './adjust-many-to-one';
import { chooseReferenceRate } from './choose-reference-rate';
import { compactLetterDisplay } from './compact-letter-display';
import { fUpperTailP } from './f-upper-tail-p';
import { fitRcbd } from './fit-rcbd';
import { missingPlotEstimate } from './missing-plot-estimate';
import { normalizeRate } from './normalize-rate';
import { sortRateLevels } from './sort-rate-levels';
import { studentTQuantile } from './student-t-quantile';
import { studentTTwoSidedP } from './student-t-two-sided-p';
import { studentizedRangeQuantile } from './studentized-range-quantile';
import type {
  AnalysisOptions,
  MissingEstimate,
  OutlierFlag,
  RateDifference,
  RateMean,
  SiteAnalysis,
  SiteStrip,
  StripResidual,
} from './types';

/** An error mean square below this share of the total mean square is rounding noise. */
const EXACT_FIT_SHARE = 1e-10;

/** Message for data whose strips the block + rate model reproduces exactly. */
const EXACT_FIT =
  'the strips fit the rates and blocks exactly; Sheaf cannot estimate the strip-to-strip variation';

/**
 * Analyses one site laid out as a randomized complete block design (RCBD), one response.
 *
 * - ANOVA with rows block, rate, error, total (R's `anova(lm(y ~ block + rate))`; with missing
 *   strips the rate SS is adjusted for blocks and error df drops by the number missing).
 * - Grand mean (of the observed strips), CV % = 100·√MSE / grand mean.
 * - Rate means (least-squares means when strips are missing) with SE, (1 − α) CI on the
 *   error df; SED; Fisher's LSD; Tukey's HSD (Tukey–Kramer for unequal SEDs) with compact
 *   letters; difference of every rate from the reference with SE, CI and t-test p
 *   (unadjusted) and, with `manyToOne: true`, Dunnett's many-to-one adjusted p and
 *   simultaneous CI beside them (as R's `multcomp::glht(lm, mcp(rate = "Dunnett"))`).
 * - Missing-strip estimates (least-squares fitted values; the classic formula too when one is
 *   missing), residuals and outliers: the Bonferroni outlier test of R's `car::outlierTest`
 *   (two-sided t p-value of each externally studentized residual on error df − 1, times the
 *   number of strips; flagged when that adjusted p is below alpha).
 * - Rates are equal when their numbers are equal ("1" and "1.0"). Tukey's HSD needs at least
 *   2 error df (as R's `ptukey`); with 1 the site is analysed without it and says so.
 *
 * The reference is `options.reference`, else "1" (the full rate), else the rate with the
 * most observed strips (ties: the middle level). Blocks with no data are dropped (noted).
 *
 * Source: Gomez & Gomez (1984), Statistical Procedures for Agricultural Research, 2nd ed.,
 * ch. 2.2 (RCBD), ch. 5 (LSD, DMRT), 7.1.2 (missing data); Tukey (1953); Kramer (1956);
 * Belsley, Kuh & Welsch (1980) for studentized residuals; Weisberg (2014), Applied Linear
 * Regression, 4th ed., 9.4.3 (Bonferroni outlier test), as in Fox & Weisberg's `car`.
 *
 * @param rows - strips of one site: block, rate and value (null = missing)
 * @param options - reference rate and alpha (default 0.05)
 * @returns the site analysis
 * @throws Error when a rate has no data, fewer than two blocks have data, no error df is
 *   left, a strip appears twice, a value is not finite or is negative, the grand mean is 0,
 *   the strips fit blocks and rates exactly (error MS below 1e-10 of the total MS), or the
 *   values are so large that their squares overflow
 * @example analyzeSite(gomezSeedRateRows).anova[1].f // 2.1678 (Gomez & Gomez 1984, Table 2.6)
 */
export function analyzeSite(
  rows: readonly SiteStrip[],
  options: AnalysisOptions = {},
): SiteAnalysis {
  const alpha = options.alpha ?? 0.05;
  if (!(alpha > 0 && alpha < 1)) throw new Error(`analyzeSite needs 0 < alpha < 1 (got ${alpha})`);
  const blockIndex = new Map<string, number>();
  const rateSeen = new Map<string, number>();
  const cells = new Map<string, number | null>();
  rows.forEach((row, index) => {
    const block = String(row.block).trim();
    if (block === '') throw new Error(`analyzeSite: strip ${index + 1} has no block`);
    if (String(row.rate).trim() === '')
      throw new Error(`analyzeSite: strip ${index + 1} has no rate`);
    const rate = normalizeRate(row.rate);
    if (row.value !== null && !Number.isFinite(row.value)) {
      throw new Error(
        `analyzeSite: strip ${index + 1} (block ${block}, rate ${rate}) has a value that is not a finite number`,
      );
    }
    if (row.value !== null && row.value < 0) {
      throw new Error(
        `analyzeSite: strip ${index + 1} (block ${block}, rate ${rate}) has a negative value (${row.value}); yields, counts and weights cannot be below zero`,
      );
    }
    if (!blockIndex.has(block)) blockIndex.set(block, blockIndex.size);
    if (!rateSeen.has(rate)) rateSeen.set(rate, rateSeen.size);
    const key = `${block}\u0000${rate}`;
    if (cells.has(key))
      throw new Error(`analyzeSite: block ${block} has rate ${rate} more than once`);
    cells.set(key, row.value);
  });
  const rateLevels = sortRateLevels([...rateSeen.keys()]);
  if (rateLevels.length < 2)
    throw new Error(`analyzeSite needs at least 2 rates (got ${rateLevels.length})`);
  const notes: string[] = [];
  const allBlocks = [...blockIndex.keys()];
  const blockNames = allBlocks.filter((block) =>
    rateLevels.some((rate) => {
      const value = cells.get(`${block}\u0000${rate}`);
      return value !== undefined && value !== null;
    }),
  );
  const dropped = allBlocks.filter((block) => !blockNames.includes(block));
  if (dropped.length > 0) notes.push(`Block ${dropped.join(', ')} has no data and was left out.`);
  if (blockNames.length < 2) {
    throw new Error(
      `analyzeSite: fewer than two blocks have data (${blockNames.length}); a site needs at least 2 blocks`,
    );
  }
  const table = blockNames.map((block) =>
    rateLevels.map((rate) => {
      const value = cells.get(`${block}\u0000${rate}`);
      return value === undefined || value === null ? Number.NaN : value;
    }),
  );
  rateLevels.forEach((rate, i) => {
    if (table.every((row) => Number.isNaN(row[i] as number)))
      throw new Error(`analyzeSite: rate ${rate} has no data`);
  });
  const blocks = blockNames.length;
  const rates = rateLevels.length;
  const missing =
    blocks * rates - table.reduce((n, row) => n + row.filter((y) => !Number.isNaN(y)).length, 0);
  if (blocks * rates - missing - blocks - rates + 1 < 1) {
    throw new Error(
      `analyzeSite: no error degrees of freedom left (${blocks} blocks × ${rates} rates with ${missing} missing strips)`,
    );
  }
  const fit = fitRcbd(table);
  if (![fit.ssTotal, fit.ssError, fit.ssRate, fit.ssBlock].every(Number.isFinite)) {
    throw new Error(
      'analyzeSite: the values are too large to analyse: their squares overflow double precision (above about 1e154); rescale them (e.g. t/ha instead of kg/ha)',
    );
  }
  if (fit.grandMean === 0) {
    throw new Error(
      'analyzeSite: the grand mean is 0 (every strip is zero); there is nothing to compare',
    );
  }
  const errorDf = fit.dfError;
  const errorMeanSquare = fit.ssError / errorDf;
  const totalMeanSquare = fit.ssTotal / (fit.observed - 1);
  if (!(errorMeanSquare > EXACT_FIT_SHARE * totalMeanSquare)) {
    throw new Error(`analyzeSite: ${EXACT_FIT}`);
  }
  const reference = chooseReferenceRate(
    rateLevels,
    fit.counts,
    options.reference === undefined ? undefined : normalizeRate(options.reference),
  );
  const referenceIndex = rateLevels.indexOf(reference);
  const tCritical = studentTQuantile(1 - alpha / 2, errorDf);
  // R's ptukey is undefined below 2 df; with 1 error df the site goes without Tukey.
  const tukey = errorDf >= 2;
  const qCritical = tukey ? studentizedRangeQuantile(1 - alpha, rates, errorDf) : Number.NaN;
  const msBlock = fit.ssBlock / fit.dfBlock;
  const msRate = fit.ssRate / fit.dfRate;
  const fBlock = msBlock / errorMeanSquare;
  const fRate = msRate / errorMeanSquare;

  let sedSum = 0;
  let pairs = 0;
  for (let i = 0; i < rates; i++) {
    for (let k = i + 1; k < rates; k++) {
      sedSum += Math.sqrt(errorMeanSquare * fit.differenceVariance(i, k));
      pairs += 1;
    }
  }
  const sed = sedSum / pairs;
  const letters = tukey
    ? compactLetterDisplay(fit.means, (i, k) => {
        const sedPair = Math.sqrt(errorMeanSquare * fit.differenceVariance(i, k));
        return (
          Math.abs((fit.means[i] as number) - (fit.means[k] as number)) >
          (qCritical * sedPair) / Math.SQRT2
        );
      })
    : rateLevels.map(() => '');
  const means: RateMean[] = rateLevels.map((rate, i) => {
    const mean = fit.means[i] as number;
    const se = Math.sqrt(errorMeanSquare * fit.meanVariance(i));
    return {
      rate,
      n: fit.counts[i] as number,
      mean,
      se,
      ciLow: mean - tCritical * se,
      ciHigh: mean + tCritical * se,
      group: letters[i] as string,
    };
  });
  const referenceMean = fit.means[referenceIndex] as number;
  const differences: RateDifference[] = [];
  rateLevels.forEach((rate, i) => {
    if (i === referenceIndex) return;
    const diff = (fit.means[i] as number) - referenceMean;
    const se = Math.sqrt(errorMeanSquare * fit.differenceVariance(i, referenceIndex));
    differences.push({
      rate,
      diff,
      se,
      ciLow: diff - tCritical * se,
      ciHigh: diff + tCritical * se,
      p: studentTTwoSidedP(diff / se, errorDf),
    });
  });
  // Dunnett: Cov(d_i, d_j) = ½[Var(d_i) + Var(d_j) − Var(m_i − m_j)], one error df for all.
  const others = rateLevels.flatMap((_, i) => (i === referenceIndex ? [] : [i]));
  const covariance = others.map((i) =>
    others.map(
      (j) =>
        (errorMeanSquare *
          (fit.differenceVariance(i, referenceIndex) +
            fit.differenceVariance(j, referenceIndex) -
            fit.differenceVariance(i, j))) /
        2,
    ),
  );
  const adjustments =
    options.manyToOne !== true
      ? []
      : adjustManyToOne(
          differences.map((d) => d.diff),
          covariance,
          differences.map(() => errorDf),
          alpha,
        );
  adjustments.forEach((adjusted, index) => {
    const difference = differences[index]!;
    difference.pAdjusted = adjusted.pAdjusted;
    difference.ciLowAdjusted = adjusted.ciLowAdjusted;
    difference.ciHighAdjusted = adjusted.ciHighAdjusted;
  });

  const missingEstimates: MissingEstimate[] = [];
  const residuals: StripResidual[] = [];
  const outliers: OutlierFlag[] = [];
  let grandTotal = 0;
  for (const row of table) for (const y of row) if (!Number.isNaN(y)) grandTotal += y;
  for (let j = 0; j < blocks; j++) {
    const row = table[j] as number[];
    for (let i = 0; i < rates; i++) {
      const y = row[i] as number;
      const block = blockNames[j] as string;
      const rate = rateLevels[i] as string;
      const fitted = fit.fitted(j, i);
      if (Number.isNaN(y)) {
        const estimate: MissingEstimate = { block, rate, estimate: fitted };
        if (missing === 1) {
          let blockTotal = 0;
          for (const value of row) if (!Number.isNaN(value)) blockTotal += value;
          let rateTotal = 0;
          for (const other of table)
            if (!Number.isNaN(other[i] as number)) rateTotal += other[i] as number;
          estimate.classicEstimate = missingPlotEstimate(
            blockTotal,
            rateTotal,
            grandTotal,
            blocks,
            rates,
          );
        }
        missingEstimates.push(estimate);
        continue;
      }
      const residual = y - fitted;
      const spare = 1 - fit.leverage(j, i);
      let studentized: number | null = null;
      if (spare > 1e-10 && errorDf > 1) {
        const internal = residual / Math.sqrt(errorMeanSquare * spare);
        const denominator = errorDf - internal * internal;
        if (denominator > 1e-12) studentized = internal * Math.sqrt((errorDf - 1) / denominator);
      }
      residuals.push({ block, rate, value: y, fitted, residual, studentized });
    }
  }
  // Bonferroni outlier test (car::outlierTest): p of each rstudent on errorDf − 1, × n.
  const tested = residuals.filter((r) => r.studentized !== null).length;
  for (const entry of residuals) {
    if (entry.studentized === null) continue;
    const p = studentTTwoSidedP(entry.studentized, errorDf - 1);
    entry.pBonferroni = Math.min(1, tested * p);
    if (entry.pBonferroni < alpha) {
      outliers.push({
        block: entry.block,
        rate: entry.rate,
        value: entry.value,
        studentized: entry.studentized,
        p,
        pBonferroni: entry.pBonferroni,
      });
    }
  }
  if (missing > 0) {
    notes.push(
      `${missing} missing strip${missing === 1 ? '' : 's'}: fitted by least squares; rate SS adjusted for blocks, error df reduced by ${missing}, rate means are least-squares means.`,
    );
  }
  if (outliers.length > 0) {
    notes.push(
      `${outliers.length} strip${outliers.length === 1 ? '' : 's'} far from what block and rate predict (Bonferroni outlier test, adjusted p < ${alpha}): check the field notes.`,
    );
  }
  if (!tukey) {
    notes.push(
      `Only ${errorDf} error degree of freedom: Tukey's test needs at least 2, so rates are not grouped by letters and no HSD is given.`,
    );
  }
  return {
    blocks,
    rates,
    missing,
    anova: [
      {
        source: 'block',
        df: fit.dfBlock,
        ss: fit.ssBlock,
        ms: msBlock,
        f: fBlock,
        p: fUpperTailP(fBlock, fit.dfBlock, errorDf),
      },
      {
        source: 'rate',
        df: fit.dfRate,
        ss: fit.ssRate,
        ms: msRate,
        f: fRate,
        p: fUpperTailP(fRate, fit.dfRate, errorDf),
      },
      { source: 'error', df: errorDf, ss: fit.ssError, ms: errorMeanSquare },
      { source: 'total', df: fit.observed - 1, ss: fit.ssTotal },
    ],
    grandMean: fit.grandMean,
    cvPercent: (100 * Math.sqrt(errorMeanSquare)) / fit.grandMean,
    sed,
    lsd: tCritical * sed,
    hsd: tukey ? (qCritical * sed) / Math.SQRT2 : null,
    means,
    differences,
    missingEstimates,
    outliers,
    method: fit.method,
    errorMeanSquare,
    errorDf,
    alpha,
    reference,
    residuals,
    notes,
  };
}
