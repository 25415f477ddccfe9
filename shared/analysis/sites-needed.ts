// Network planning: sites needed to detect a pooled yield difference.
import { studentTQuantile } from './student-t-quantile';

export type SitesNeededInput = {
  /** Within-site strip CV, %. */
  cvPercent: number;
  /** CV of the site × rate interaction (how much rate effects vary among sites), %; default 5. */
  siteByRateCvPercent?: number;
  blocksPerSite: number;
  /** Difference to detect: % of the mean, or absolute with `mean`. */
  difference: number;
  differenceIsPercent?: boolean;
  mean?: number;
  rates: number;
  alpha?: number;
  power?: number;
  maxSites?: number;
};

/**
 * Number of sites s so that the pooled test of two rate means (rate tested against site × rate)
 * detects a difference d: the smallest s with
 * s ≥ 2·(t(α/2, df) + t(β, df))²·(CV²site×rate + CV²/r)/d², df = (s − 1)(t − 1), iterated.
 * The default site × rate CV of 5 % is an assumption; estimate it from a previous season's
 * pooled analysis (√(MS site:rate − MS error)/r ÷ mean) when one exists.
 *
 * Source: Cochran & Cox (1957), sec. 2.13 (same iteration), with the variance of a rate mean
 * over random sites from the expected mean squares in Gomez & Gomez (1984), ch. 8.1.
 *
 * @param input - within-site CV %, site × rate CV %, blocks per site, difference, rates, α, power
 * @returns sites, the site:rate df and the t quantiles used
 * @throws Error for non-positive inputs or more than maxSites needed
 * @example sitesNeeded({ cvPercent: 10, blocksPerSite: 4, difference: 10, rates: 4 }).sites // 9 (df 24)
 */
export function sitesNeeded(input: SitesNeededInput): {
  sites: number;
  df: number;
  tAlpha: number;
  tBeta: number;
} {
  const alpha = input.alpha ?? 0.05;
  const power = input.power ?? 0.8;
  const interactionCv = input.siteByRateCvPercent ?? 5;
  const maxSites = input.maxSites ?? 500;
  if (!(input.cvPercent > 0) || !(interactionCv >= 0))
    throw new Error('sitesNeeded needs cvPercent > 0 and siteByRateCvPercent ≥ 0');
  if (!(input.blocksPerSite >= 1) || !(input.rates >= 2))
    throw new Error('sitesNeeded needs blocksPerSite ≥ 1 and rates ≥ 2');
  if (!(alpha > 0 && alpha < 1) || !(power > 0 && power < 1))
    throw new Error('sitesNeeded needs 0 < alpha, power < 1');
  if (!(input.difference > 0)) throw new Error('sitesNeeded needs a difference > 0');
  const isPercent = input.differenceIsPercent ?? input.mean === undefined;
  if (!isPercent && !(input.mean !== undefined && input.mean > 0)) {
    throw new Error('sitesNeeded needs the expected mean for an absolute difference');
  }
  const percent = isPercent ? input.difference : (100 * input.difference) / (input.mean as number);
  const varianceUnit = interactionCv ** 2 + input.cvPercent ** 2 / input.blocksPerSite;
  for (let sites = 2; sites <= maxSites; sites++) {
    const df = (sites - 1) * (input.rates - 1);
    const tAlpha = studentTQuantile(1 - alpha / 2, df);
    const tBeta = studentTQuantile(power, df);
    if (sites >= (2 * (tAlpha + tBeta) ** 2 * varianceUnit) / percent ** 2)
      return { sites, df, tAlpha, tBeta };
  }
  throw new Error(`sitesNeeded: more than ${maxSites} sites would be needed`);
}
