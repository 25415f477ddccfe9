// Splits strips into sites and works out the shared rate levels and reference.
import { chooseReferenceRate } from './choose-reference-rate';
import { normalizeRate } from './normalize-rate';
import { sortRateLevels } from './sort-rate-levels';
import type { SiteStrip, StripObservation } from './types';

/**
 * Groups strip observations by site (in order of first appearance), lists the rate levels
 * (equal numbers are one rate, see normalizeRate; sorted numerically when all are numbers) and picks one reference rate for the whole
 * trial (see chooseReferenceRate).
 *
 * @param rows - strips of every site
 * @param requestedReference - reference asked for, if any
 * @returns sites with their strips, rate levels and the reference
 * @throws Error when there are no strips, a site name is empty, or the reference is unknown
 * @example groupBySite([{ site: 'A', block: '1', rate: 1, value: 3 }]).reference // '1'
 */
export function groupBySite(
  rows: readonly StripObservation[],
  requestedReference?: string,
): { sites: { site: string; rows: SiteStrip[] }[]; rateLevels: string[]; reference: string } {
  if (rows.length === 0) throw new Error('groupBySite needs at least one strip');
  const bySite = new Map<string, SiteStrip[]>();
  const counts = new Map<string, number>();
  rows.forEach((row, index) => {
    const site = String(row.site).trim();
    if (site === '') throw new Error(`groupBySite: strip ${index + 1} has no site`);
    if (String(row.rate).trim() === '')
      throw new Error(`groupBySite: strip ${index + 1} has no rate`);
    const rate = normalizeRate(row.rate);
    let list = bySite.get(site);
    if (!list) bySite.set(site, (list = []));
    list.push({ block: row.block, rate, value: row.value });
    counts.set(rate, (counts.get(rate) ?? 0) + (row.value === null ? 0 : 1));
  });
  const rateLevels = sortRateLevels([...counts.keys()]);
  const reference = chooseReferenceRate(
    rateLevels,
    rateLevels.map((rate) => counts.get(rate) ?? 0),
    requestedReference === undefined ? undefined : normalizeRate(requestedReference),
  );
  return {
    sites: [...bySite].map(([site, list]) => ({ site, rows: list })),
    rateLevels,
    reference,
  };
}
