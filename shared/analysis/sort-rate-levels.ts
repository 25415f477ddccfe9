// Orders rate levels: numerically when every level is a number, else as first seen.

/**
 * Sorts seeding-rate level keys. When every key parses as a finite number ("0.25", "1",
 * "150") they sort by value; otherwise they keep the order in which they were given.
 *
 * @param levels - distinct rate keys
 * @returns a new, sorted array
 * @example sortRateLevels(['2', '0.25', '1', '0.5']) // ['0.25', '0.5', '1', '2']
 */
export function sortRateLevels(levels: readonly string[]): string[] {
  const numeric = levels.every((level) => level.trim() !== '' && Number.isFinite(Number(level)));
  const copy = [...levels];
  return numeric ? copy.sort((a, b) => Number(a) - Number(b)) : copy;
}
