// Attaches the network mixed model to a pooled analysis, or a note saying why it is missing.
import { analyzeNetworkMixedModel } from './analyze-network-mixed-model';
import type { PooledAnalysis, StripObservation } from './types';

/**
 * Adds `mixed` (see analyzeNetworkMixedModel) to a pooled analysis. A model that cannot be
 * fitted does not stop the pooled analysis: a note gives the reason instead.
 *
 * Source: Smith, Cullis & Thompson (2005) J. Agric. Sci. 143:449–462 (mixed models for
 * multi-environment trials).
 *
 * @param pooled - the pooled analysis to extend (changed in place)
 * @param rows - every strip of the trial
 * @param rateLevels - rate keys in order
 * @param reference - reference rate key
 * @param alpha - 1 − confidence (default 0.05)
 * @returns nothing; `pooled.mixed` or a note is set
 * @throws never; fitting errors become a note
 * @example addMixedModel(pooled, rows, ['0.5', '1'], '1') // pooled.mixed.rateTest.ddf === 'kenward-roger'
 */
export function addMixedModel(
  pooled: PooledAnalysis,
  rows: readonly StripObservation[],
  rateLevels: readonly string[],
  reference: string,
  alpha?: number,
): void {
  try {
    pooled.mixed = analyzeNetworkMixedModel(rows, rateLevels, reference, alpha);
  } catch (error) {
    pooled.notes.push(`Mixed model not fitted: ${(error as Error).message}`);
  }
}
