// Compact letter display: means sharing a letter are not significantly different.

/**
 * Compact letter display by the insert-and-absorb algorithm. Letters are assigned in order
 * of decreasing mean, so the highest mean gets "a".
 *
 * Source: Piepho, H.-P. (2004) An algorithm for a letter-based representation of
 * all-pairwise comparisons. J. Comput. Graph. Stat. 13:456–466.
 *
 * @param means - one mean per treatment
 * @param differs - differs(i, j) is true when treatments i and j differ significantly
 * @returns one letter string per treatment, in the input order
 * @throws Error when means is empty
 * @example compactLetterDisplay([10, 9, 5], (i, j) => Math.abs([10, 9, 5][i]! - [10, 9, 5][j]!) > 2) // ['a', 'a', 'b']
 */
export function compactLetterDisplay(
  means: readonly number[],
  differs: (i: number, j: number) => boolean,
): string[] {
  const count = means.length;
  if (count === 0) throw new Error('compactLetterDisplay needs at least one mean');
  let columns: Set<number>[] = [new Set(means.map((_, i) => i))];
  for (let i = 0; i < count; i++) {
    for (let j = i + 1; j < count; j++) {
      if (!differs(i, j)) continue;
      const next: Set<number>[] = [];
      for (const column of columns) {
        if (column.has(i) && column.has(j)) {
          const withoutJ = new Set(column);
          withoutJ.delete(j);
          const withoutI = new Set(column);
          withoutI.delete(i);
          next.push(withoutJ, withoutI);
        } else next.push(column);
      }
      // Absorb: drop columns contained in another column.
      columns = next.filter(
        (column, index) =>
          !next.some(
            (other, otherIndex) =>
              otherIndex !== index &&
              other.size >= column.size &&
              [...column].every((member) => other.has(member)) &&
              (other.size > column.size || otherIndex < index),
          ),
      );
    }
  }
  const order = means.map((_, i) => i).sort((a, b) => (means[b] as number) - (means[a] as number));
  const rank = new Map(order.map((treatment, position) => [treatment, position]));
  const firstRank = (column: Set<number>) =>
    Math.min(...[...column].map((m) => rank.get(m) as number));
  columns.sort((a, b) => firstRank(a) - firstRank(b));
  const letters = means.map(() => '');
  columns.forEach((column, index) => {
    const letter =
      index < 26
        ? String.fromCharCode(97 + index)
        : `${String.fromCharCode(97 + (index % 26))}${Math.floor(index / 26)}`;
    for (const member of column) letters[member] += letter;
  });
  return letters;
}
