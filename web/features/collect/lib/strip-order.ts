// The order strips are walked in on the entry pages: block by block, then by position in the
// block (the order they are sown), so plot 101 comes before 102 and 199 before 201.
import type { StripDto } from '../../../../shared/schemas/strip';

type Placed = Pick<StripDto, 'stripId' | 'block' | 'position'>;

/** The strips in field order, as a new array. */
export function fieldOrder<T extends Placed>(strips: readonly T[]): T[] {
  return [...strips].sort((a, b) => a.block - b.block || a.position - b.position);
}

/** The strips before and after one strip in field order (undefined at either end). */
export function neighbours<T extends Placed>(
  strips: readonly T[],
  stripId: string,
): { previous: T | undefined; next: T | undefined } {
  const order = fieldOrder(strips);
  const index = order.findIndex((s) => s.stripId === stripId);
  if (index < 0) return { previous: undefined, next: undefined };
  return { previous: order[index - 1], next: order[index + 1] };
}
