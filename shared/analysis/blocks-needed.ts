// Replication planning: blocks per site needed to detect a yield difference.
import { studentTQuantile } from './student-t-quantile';

export type BlocksNeededInput = {
  /** Expected coefficient of variation of strips within a site, %. */
  cvPercent: number;
  /** Smallest difference worth detecting: % of the mean, or absolute with `mean`. */
  difference: number;
  differenceIsPercent?: boolean;
  /** Expected mean, needed when `difference` is absolute. */
  mean?: number;
  /** Number of rates in the trial. */
  rates: number;
  alpha?: number;
  power?: number;
  maxBlocks?: number;
};

/**
 * Number of blocks r so that a two-sided test at level α detects a difference d between two
 * rate means with the given power: the smallest r with r ≥ 2·(t(α/2, df) + t(β, df))²·CV²/d²,
 * iterated because the t quantiles use the actual error df = (r − 1)(t − 1).
 *
 * Source: Cochran, W.G. & Cox, G.M. (1957), Experimental Designs, 2nd ed., sec. 2.13, eq. 2.2;
 * Gomez & Gomez (1984), ch. 15 (plot size and replication).
 *
 * @param input - CV %, difference (percent of mean by default), number of rates, α (0.05), power (0.8)
 * @returns blocks, the error df at that number, the t quantiles used and the difference
 *   detectable with that many blocks (% of mean)
 * @throws Error for non-positive CV or difference, fewer than 2 rates, or more than maxBlocks needed
 * @example blocksNeeded({ cvPercent: 10, difference: 15, rates: 4 }).blocks // 8 (error df 21)
 */
export function blocksNeeded(input: BlocksNeededInput): {
  blocks: number;
  errorDf: number;
  tAlpha: number;
  tBeta: number;
  detectablePercent: number;
} {
  const alpha = input.alpha ?? 0.05;
  const power = input.power ?? 0.8;
  const maxBlocks = input.maxBlocks ?? 200;
  if (!(input.cvPercent > 0)) throw new Error('blocksNeeded needs cvPercent > 0');
  if (!(input.rates >= 2)) throw new Error('blocksNeeded needs at least 2 rates');
  if (!(alpha > 0 && alpha < 1) || !(power > 0 && power < 1))
    throw new Error('blocksNeeded needs 0 < alpha, power < 1');
  const percent = differencePercent(
    input.difference,
    input.differenceIsPercent ?? input.mean === undefined,
    input.mean,
    'blocksNeeded',
  );
  for (let blocks = 2; blocks <= maxBlocks; blocks++) {
    const errorDf = (blocks - 1) * (input.rates - 1);
    const tAlpha = studentTQuantile(1 - alpha / 2, errorDf);
    const tBeta = studentTQuantile(power, errorDf);
    const required = (2 * (tAlpha + tBeta) ** 2 * input.cvPercent ** 2) / percent ** 2;
    if (blocks >= required) {
      return {
        blocks,
        errorDf,
        tAlpha,
        tBeta,
        detectablePercent: (tAlpha + tBeta) * input.cvPercent * Math.sqrt(2 / blocks),
      };
    }
  }
  throw new Error(
    `blocksNeeded: more than ${maxBlocks} blocks would be needed; aim for a larger difference or lower CV`,
  );
}

function differencePercent(
  difference: number,
  isPercent: boolean,
  mean: number | undefined,
  name: string,
): number {
  if (!(difference > 0)) throw new Error(`${name} needs a difference > 0`);
  if (isPercent) return difference;
  if (!(mean !== undefined && mean > 0))
    throw new Error(`${name} needs the expected mean for an absolute difference`);
  return (100 * difference) / mean;
}
