// Picks the rate every other rate is compared with.

/**
 * Chooses the reference rate. Rule: the requested level when given (it must exist); else
 * "1" (the full rate, 1×) when present; else the level with the most observed strips, ties
 * broken by the level nearest the middle of the sorted levels (the lower of two middles).
 *
 * @param levels - sorted rate keys
 * @param counts - observed strips per level, same order as `levels`
 * @param requested - reference asked for by the user, if any
 * @returns the reference key
 * @throws Error when the requested level does not exist or there are no levels
 * @example chooseReferenceRate(['0.25', '0.5', '1', '2'], [4, 4, 4, 4]) // '1'
 */
export function chooseReferenceRate(
  levels: readonly string[],
  counts: readonly number[],
  requested?: string,
): string {
  if (levels.length === 0) throw new Error('chooseReferenceRate needs at least one rate level');
  if (requested !== undefined) {
    const match = levels.find(
      (level) =>
        level === requested || (Number(level) === Number(requested) && requested.trim() !== ''),
    );
    if (match === undefined) {
      throw new Error(
        `chooseReferenceRate: reference rate "${requested}" is not one of ${levels.join(', ')}`,
      );
    }
    return match;
  }
  const full = levels.find(
    (level) => level === '1' || (level.trim() !== '' && Number(level) === 1),
  );
  if (full !== undefined) return full;
  const middle = (levels.length - 1) / 2;
  let best = 0;
  for (let i = 1; i < levels.length; i++) {
    const better = (counts[i] ?? 0) > (counts[best] ?? 0);
    const tie = (counts[i] ?? 0) === (counts[best] ?? 0);
    if (better || (tie && Math.abs(i - middle) < Math.abs(best - middle) - 1e-9)) best = i;
  }
  return levels[best] as string;
}
