// Fits the additive block + rate model of one RCBD site (closed form, or least squares when strips are missing).
import { Matrix, inverse } from 'ml-matrix';

/** Result of fitting y = μ + block + rate + error to one site. */
export type RcbdFit = {
  method: 'balanced' | 'least-squares';
  observed: number;
  ssBlock: number;
  ssRate: number;
  ssError: number;
  ssTotal: number;
  dfBlock: number;
  dfRate: number;
  dfError: number;
  grandMean: number;
  /** Observed strips per rate. */
  counts: number[];
  /** Least-squares means of the rates (plain means when balanced). */
  means: number[];
  /** Var(mean_i) / σ². */
  meanVariance: (rate: number) => number;
  /** Var(mean_i − mean_j) / σ². */
  differenceVariance: (rate: number, other: number) => number;
  fitted: (block: number, rate: number) => number;
  leverage: (block: number, rate: number) => number;
};

/**
 * Fits the RCBD additive model. With every strip present it uses the textbook closed form;
 * otherwise ordinary least squares (ml-matrix) with the rate sum of squares adjusted for
 * blocks and the block sum of squares unadjusted, as R's `anova(lm(y ~ block + rate))`.
 *
 * Source: Gomez & Gomez (1984), sec. 2.2.3 (balanced) and 7.1.2 (missing plots); Searle
 * (1971), Linear Models, ch. 7 (two-way additive model, unequal numbers).
 *
 * @param table - table[block][rate], NaN where the strip is missing
 * @returns sums of squares, degrees of freedom, means and variance helpers
 * @throws Error when a block or rate has no data, the layout is disconnected, or error df < 1
 * @example fitRcbd([[1, 2], [3, 5], [4, 4]]).ssRate // 1.5
 */
export function fitRcbd(table: readonly (readonly number[])[]): RcbdFit {
  const blocks = table.length;
  const rates = table[0]?.length ?? 0;
  if (blocks < 2) throw new Error(`fitRcbd needs at least 2 blocks with data (got ${blocks})`);
  if (rates < 2) throw new Error(`fitRcbd needs at least 2 rates (got ${rates})`);
  const blockSum = new Float64Array(blocks);
  const blockCount = new Float64Array(blocks);
  const rateSum = new Float64Array(rates);
  const counts = new Array<number>(rates).fill(0);
  let sum = 0;
  let observed = 0;
  for (let j = 0; j < blocks; j++) {
    const row = table[j] as readonly number[];
    if (row.length !== rates) throw new Error('fitRcbd needs every block row to list every rate');
    for (let i = 0; i < rates; i++) {
      const y = row[i] as number;
      if (Number.isNaN(y)) continue;
      blockSum[j]! += y;
      blockCount[j]! += 1;
      rateSum[i]! += y;
      counts[i]! += 1;
      sum += y;
      observed += 1;
    }
  }
  for (let i = 0; i < rates; i++)
    if (counts[i] === 0) throw new Error(`fitRcbd: rate ${i + 1} has no data`);
  for (let j = 0; j < blocks; j++)
    if (blockCount[j] === 0) throw new Error(`fitRcbd: block ${j + 1} has no data`);
  const grandMean = sum / observed;
  let ssTotal = 0;
  let ssWithinBlocks = 0;
  for (let j = 0; j < blocks; j++) {
    const row = table[j] as readonly number[];
    const blockMean = (blockSum[j] as number) / (blockCount[j] as number);
    for (let i = 0; i < rates; i++) {
      const y = row[i] as number;
      if (Number.isNaN(y)) continue;
      ssTotal += (y - grandMean) ** 2;
      ssWithinBlocks += (y - blockMean) ** 2;
    }
  }
  const ssBlock = ssTotal - ssWithinBlocks;
  const dfBlock = blocks - 1;
  const dfRate = rates - 1;
  const dfError = observed - blocks - rates + 1;
  if (dfError < 1) throw new Error(`fitRcbd: no error degrees of freedom left (${dfError})`);

  if (observed === blocks * rates) {
    const blockMeans = Array.from(blockSum, (s) => s / rates);
    const means = Array.from(rateSum, (s) => s / blocks);
    let ssRate = 0;
    for (const mean of means) ssRate += blocks * (mean - grandMean) ** 2;
    const leverage = (blocks + rates - 1) / (blocks * rates);
    return {
      method: 'balanced',
      observed,
      ssBlock,
      ssRate,
      ssError: Math.max(0, ssTotal - ssBlock - ssRate),
      ssTotal,
      dfBlock,
      dfRate,
      dfError,
      grandMean,
      counts,
      means,
      meanVariance: () => 1 / blocks,
      differenceVariance: (i, k) => (i === k ? 0 : 2 / blocks),
      fitted: (j, i) => (blockMeans[j] as number) + (means[i] as number) - grandMean,
      leverage: () => leverage,
    };
  }

  assertConnected(table, blocks, rates);
  // Parameters: intercept, blocks 2..b, rates 2..t (treatment contrasts, as R's lm).
  const parameters = blocks + rates - 1;
  const columnsOf = (j: number, i: number): number[] => {
    const columns = [0];
    if (j > 0) columns.push(j);
    if (i > 0) columns.push(blocks - 1 + i);
    return columns;
  };
  const crossProducts = Matrix.zeros(parameters, parameters);
  const xty = new Float64Array(parameters);
  for (let j = 0; j < blocks; j++) {
    const row = table[j] as readonly number[];
    for (let i = 0; i < rates; i++) {
      const y = row[i] as number;
      if (Number.isNaN(y)) continue;
      const columns = columnsOf(j, i);
      for (const a of columns) {
        xty[a]! += y;
        for (const b of columns) crossProducts.set(a, b, crossProducts.get(a, b) + 1);
      }
    }
  }
  const covariance = inverse(crossProducts);
  const coefficients = new Float64Array(parameters);
  for (let a = 0; a < parameters; a++) {
    let value = 0;
    for (let b = 0; b < parameters; b++) value += covariance.get(a, b) * (xty[b] as number);
    coefficients[a] = value;
  }
  const fitted = (j: number, i: number) => {
    let value = coefficients[0] as number;
    if (j > 0) value += coefficients[j] as number;
    if (i > 0) value += coefficients[blocks - 1 + i] as number;
    return value;
  };
  let ssError = 0;
  for (let j = 0; j < blocks; j++) {
    const row = table[j] as readonly number[];
    for (let i = 0; i < rates; i++) {
      const y = row[i] as number;
      if (!Number.isNaN(y)) ssError += (y - fitted(j, i)) ** 2;
    }
  }
  // Contrast vector of a least-squares mean: intercept + average block effect + rate effect.
  const meanVector = (i: number): Float64Array => {
    const vector = new Float64Array(parameters);
    vector[0] = 1;
    for (let j = 1; j < blocks; j++) vector[j] = 1 / blocks;
    if (i > 0) vector[blocks - 1 + i] = 1;
    return vector;
  };
  const quadratic = (vector: Float64Array): number => {
    let total = 0;
    for (let a = 0; a < parameters; a++) {
      const va = vector[a] as number;
      if (va === 0) continue;
      for (let b = 0; b < parameters; b++)
        total += va * covariance.get(a, b) * (vector[b] as number);
    }
    return total;
  };
  const means: number[] = [];
  const meanVariances: number[] = [];
  for (let i = 0; i < rates; i++) {
    const vector = meanVector(i);
    let mean = 0;
    for (let a = 0; a < parameters; a++)
      mean += (vector[a] as number) * (coefficients[a] as number);
    means.push(mean);
    meanVariances.push(quadratic(vector));
  }
  return {
    method: 'least-squares',
    observed,
    ssBlock,
    ssRate: Math.max(0, ssWithinBlocks - ssError),
    ssError,
    ssTotal,
    dfBlock,
    dfRate,
    dfError,
    grandMean,
    counts,
    means,
    meanVariance: (i) => meanVariances[i] as number,
    differenceVariance: (i, k) => {
      const vector = meanVector(i);
      const other = meanVector(k);
      for (let a = 0; a < parameters; a++) vector[a] = (vector[a] as number) - (other[a] as number);
      return quadratic(vector);
    },
    fitted,
    leverage: (j, i) => {
      const vector = new Float64Array(parameters);
      for (const column of columnsOf(j, i)) vector[column] = 1;
      return quadratic(vector);
    },
  };
}

function assertConnected(
  table: readonly (readonly number[])[],
  blocks: number,
  rates: number,
): void {
  // Blocks are nodes 0..b−1, rates b..b+t−1; an observed strip joins its block and rate.
  const parent = Array.from({ length: blocks + rates }, (_, i) => i);
  const find = (x: number): number => {
    while (parent[x] !== x) x = parent[x] = parent[parent[x] as number] as number;
    return x;
  };
  for (let j = 0; j < blocks; j++) {
    for (let i = 0; i < rates; i++) {
      if (!Number.isNaN((table[j] as readonly number[])[i] as number))
        parent[find(j)] = find(blocks + i);
    }
  }
  const root = find(0);
  for (let node = 1; node < blocks + rates; node++) {
    if (find(node) !== root) {
      throw new Error(
        'fitRcbd: the missing strips split the blocks into unconnected groups; rates cannot be compared',
      );
    }
  }
}
