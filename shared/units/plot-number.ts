// Plot numbers as field trials write them on stakes and sheets: unique within a site.

/**
 * The plot number of a strip: block × 100 + position (block 1 → 101, 102 …; block 2 → 201 …),
 * the usual numbering of replicated field trials, so no two strips of a site share a number.
 *
 * @param block block (replicate) number, from 1
 * @param position position of the strip in its block, from 1 to 99
 * @returns the plot number, e.g. 203 for the third strip of block 2
 * @throws Error when block or position is not a whole number in range
 * @example plotNumber(2, 3) // 203
 */
export function plotNumber(block: number, position: number): number {
  if (!Number.isInteger(block) || block < 1)
    throw new Error('plotNumber needs a block number of 1 or more');
  if (!Number.isInteger(position) || position < 1 || position > 99)
    throw new Error('plotNumber needs a position from 1 to 99');
  return block * 100 + position;
}
