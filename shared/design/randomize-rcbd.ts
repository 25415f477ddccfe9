// Randomized complete block layout: every block holds every rate once, in a random order
// drawn from a stored seed so the same seed always gives the same map.
import seedrandom from 'seedrandom';

/**
 * Randomizes a randomized complete block design (RCBD) with a seeded Fisher–Yates shuffle
 * per block (Cochran & Cox 1957, Experimental Designs, ch. 4; Knuth, TAOCP vol. 2, 3.4.2).
 *
 * @param treatments the treatment keys (rate level ids or labels), in any order
 * @param blocks number of blocks (replicates), at least 1
 * @param seed any string; the same seed gives the same layout
 * @returns one array per block: treatment keys in field order (position 1 first)
 * @throws when there are no treatments, duplicate treatments or blocks < 1
 * @example randomizeRcbd(['a','b','c'], 2, 'x') // e.g. [['b','a','c'], ['c','b','a']]
 */
export function randomizeRcbd<T extends string>(
  treatments: readonly T[],
  blocks: number,
  seed: string,
): T[][] {
  if (treatments.length === 0) throw new Error('randomizeRcbd needs at least one treatment');
  if (new Set(treatments).size !== treatments.length)
    throw new Error('randomizeRcbd needs distinct treatments');
  if (!Number.isInteger(blocks) || blocks < 1)
    throw new Error('randomizeRcbd needs a whole number of blocks, at least 1');
  const random = seedrandom(seed);
  const layout: T[][] = [];
  for (let b = 0; b < blocks; b += 1) {
    const order = [...treatments];
    for (let i = order.length - 1; i > 0; i -= 1) {
      const j = Math.floor(random() * (i + 1));
      [order[i], order[j]] = [order[j]!, order[i]!];
    }
    layout.push(order);
  }
  return layout;
}

/** A fresh seed string for a new randomization (not security-sensitive). */
export function newRandomizationSeed(): string {
  return Math.random().toString(36).slice(2, 10) + Date.now().toString(36).slice(-4);
}
