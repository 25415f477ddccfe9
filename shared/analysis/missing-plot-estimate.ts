// Classic estimate of one missing plot in a randomized complete block design.

/**
 * Missing-plot estimate for one missing strip of an RCBD: (r·B + t·T − G) / ((r − 1)(t − 1)),
 * where B and T are the observed totals of the strip's block and rate and G the observed
 * grand total. It equals the least-squares fitted value for that strip.
 *
 * Source: Yates (1933); Gomez & Gomez (1984), sec. 7.1.2.1, eq. for RCBD.
 *
 * @param blockTotal - total of the observed strips in the missing strip's block
 * @param rateTotal - total of the observed strips of the missing strip's rate
 * @param grandTotal - total of all observed strips
 * @param blocks - number of blocks r (≥ 2)
 * @param rates - number of rates t (≥ 2)
 * @returns the estimate
 * @throws Error when blocks or rates is below 2
 * @example missingPlotEstimate(100, 80, 400, 4, 4) // (400 + 320 − 400) / 9 = 35.56
 */
export function missingPlotEstimate(
  blockTotal: number,
  rateTotal: number,
  grandTotal: number,
  blocks: number,
  rates: number,
): number {
  if (!(blocks >= 2) || !(rates >= 2)) {
    throw new Error(
      `missingPlotEstimate needs at least 2 blocks and 2 rates (got ${blocks}, ${rates})`,
    );
  }
  return (blocks * blockTotal + rates * rateTotal - grandTotal) / ((blocks - 1) * (rates - 1));
}
