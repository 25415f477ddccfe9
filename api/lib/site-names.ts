// How a farm is named to someone who does not coordinate it: its field name when the grower
// agreed, otherwise a neutral label ("Farm C") fixed by its order of enrolment in the trial.
import type { Role } from '../../shared/schemas/common';
import { isCoordinating } from '../middleware/access';

/** "Farm A" … "Farm Z", "Farm AA" …: the label of the n-th site enrolled in a trial (n ≥ 1). */
export function farmLabel(reportNumber: number): string {
  let n = Math.max(1, Math.floor(reportNumber));
  let letters = '';
  while (n > 0) {
    const rest = (n - 1) % 26;
    letters = String.fromCharCode(65 + rest) + letters;
    n = Math.floor((n - 1) / 26);
  }
  return `Farm ${letters}`;
}

export interface NamedSite {
  fieldName: string;
  growerUserId: string | null;
  namedInReports: boolean;
  reportNumber: number;
}

export interface Viewer {
  userId: string | null;
  role: Role | undefined;
}

/** Coordinators and the site's own grower see everything; everyone else sees what the grower chose. */
export function seesPrivateDetails(site: { growerUserId: string | null }, viewer: Viewer): boolean {
  if (isCoordinating(viewer.role)) return true;
  return viewer.userId !== null && site.growerUserId === viewer.userId;
}

/** The name to show this viewer. */
export function siteNameFor(site: NamedSite, viewer: Viewer): string {
  if (site.namedInReports || seesPrivateDetails(site, viewer)) return site.fieldName;
  return farmLabel(site.reportNumber);
}

function escapeRegExp(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

/**
 * Replaces every mention of the given names in every string of a JSON-like value (labels,
 * chart points, findings, exclusion reasons), so a stored snapshot can be shown under the
 * names the viewer may see. Longer names are replaced first, so "North" does not break
 * "North ridge".
 */
export function renameEverywhere<T>(value: T, replacements: ReadonlyMap<string, string>): T {
  const names = [...replacements.keys()].filter((n) => n.trim() !== '');
  if (names.length === 0) return value;
  names.sort((a, b) => b.length - a.length);
  const pattern = new RegExp(
    names.map((n) => `(?<![\\p{L}\\p{N}])${escapeRegExp(n)}(?![\\p{L}\\p{N}])`).join('|'),
    'gu',
  );
  const walk = (v: unknown): unknown => {
    if (typeof v === 'string') return v.replace(pattern, (m) => replacements.get(m) ?? m);
    if (Array.isArray(v)) return v.map(walk);
    if (v && typeof v === 'object') {
      return Object.fromEntries(Object.entries(v).map(([k, inner]) => [k, walk(inner)]));
    }
    return v;
  };
  return walk(value) as T;
}
