// A site's strip map: RCBD from a stored seed, with block orders kept different from each other.
import seedrandom from 'seedrandom';

function shuffle<T>(items: readonly T[], random: () => number): T[] {
  const order = [...items];
  for (let i = order.length - 1; i > 0; i -= 1) {
    const j = Math.floor(random() * (i + 1));
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  return order;
}

function factorial(n: number): number {
  let f = 1;
  for (let i = 2; i <= n; i += 1) f *= i;
  return f;
}

/**
 * Randomizes a randomized complete block design for one site with a seeded Fisher–Yates shuffle
 * per block (Cochran & Cox 1957, Experimental Designs, ch. 4; Knuth, TAOCP vol. 2, 3.4.2).
 * A block whose order repeats an earlier block's is drawn again from the same stream, as long
 * as there are at least as many orders as blocks, so a grower never sows two identical blocks.
 * Each block stays uniformly random over orders by symmetry; when no repeat is drawn the map
 * equals `randomizeRcbd` for the same seed.
 *
 * @param treatments rate level ids, in any order (distinct)
 * @param blocks number of blocks, at least 1
 * @param seed any text; the same seed gives the same map
 * @returns one array per block: treatments in field order (position 1 first)
 * @throws Error for no treatments, duplicates or blocks < 1
 * @example randomizeSite(['q','h','f','d'], 4, 'site-1') // four different orders of q, h, f, d
 */
export function randomizeSite<T extends string>(
  treatments: readonly T[],
  blocks: number,
  seed: string,
): T[][] {
  if (treatments.length === 0) throw new Error('randomizeSite needs at least one treatment');
  if (new Set(treatments).size !== treatments.length)
    throw new Error('randomizeSite needs distinct treatments');
  if (!Number.isInteger(blocks) || blocks < 1)
    throw new Error('randomizeSite needs a whole number of blocks, at least 1');
  const random = seedrandom(seed);
  const keepDistinct = factorial(treatments.length) >= blocks;
  const seen = new Set<string>();
  const layout: T[][] = [];
  for (let b = 0; b < blocks; b += 1) {
    let order = shuffle(treatments, random);
    for (
      let tries = 0;
      keepDistinct && seen.has(order.join('\u0000')) && tries < 1000;
      tries += 1
    ) {
      order = shuffle(treatments, random);
    }
    seen.add(order.join('\u0000'));
    layout.push(order);
  }
  return layout;
}
