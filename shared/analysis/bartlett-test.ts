// Bartlett's test that several error variances are equal.
import { chiSquareUpperTailP } from './chi-square-upper-tail-p';

/**
 * Bartlett's test of homogeneity of variances, used before pooling site error mean squares:
 * χ² = [N·ln(s²p) − Σ fᵢ·ln(sᵢ²)] / C, with N = Σ fᵢ, s²p = Σ fᵢsᵢ²/N and
 * C = 1 + (Σ 1/fᵢ − 1/N) / (3(k − 1)); k − 1 degrees of freedom. Same as R's `bartlett.test`.
 *
 * Source: Gomez & Gomez (1984), Statistical Procedures for Agricultural Research, 2nd ed.,
 * sec. 11.2.1; Snedecor & Cochran (1989), sec. 13.10.
 *
 * @param variances - error mean squares, one per site (each > 0)
 * @param dfs - their degrees of freedom (each > 0)
 * @returns chiSquare, df and the upper-tail p-value
 * @throws Error with fewer than two variances, unequal lengths, or a non-positive value
 * @example bartlettTest([0.56533125, 0.317683983333333], [8, 8]) // { chiSquare: 0.61682, df: 1, p: 0.43223 }
 */
export function bartlettTest(
  variances: readonly number[],
  dfs: readonly number[],
): { chiSquare: number; df: number; p: number } {
  const k = variances.length;
  if (k < 2 || dfs.length !== k)
    throw new Error('bartlettTest needs two or more variances, each with its df');
  let totalDf = 0;
  let pooledSum = 0;
  let logSum = 0;
  let reciprocalSum = 0;
  for (let i = 0; i < k; i++) {
    const variance = variances[i] as number;
    const df = dfs[i] as number;
    if (!(variance > 0) || !(df > 0)) {
      throw new Error(
        `bartlettTest needs positive variances and df (item ${i + 1}: ${variance}, ${df})`,
      );
    }
    totalDf += df;
    pooledSum += df * variance;
    logSum += df * Math.log(variance);
    reciprocalSum += 1 / df;
  }
  const pooled = pooledSum / totalDf;
  const correction = 1 + (reciprocalSum - 1 / totalDf) / (3 * (k - 1));
  const chiSquare = Math.max(0, (totalDf * Math.log(pooled) - logSum) / correction);
  return { chiSquare, df: k - 1, p: chiSquareUpperTailP(chiSquare, k - 1) };
}
