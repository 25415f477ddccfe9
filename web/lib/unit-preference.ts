// The unit system a person chose for pages not tied to a trial (the calculators): kept in this
// browser; until chosen, metric where the browser's region measures in metric, else imperial.
import { useCallback, useSyncExternalStore } from 'react';
import type { UnitSystem } from '../../shared/schemas/trial';

const KEY = 'sheaf.unitSystem';
const listeners = new Set<() => void>();
/** The choice made in this page when the browser keeps no storage. */
let unsaved: UnitSystem | null = null;
/** Regions that still measure fields in feet, acres and pounds. */
const IMPERIAL_REGIONS = new Set(['US', 'LR', 'MM']);

/**
 * The unit system a language tag suggests: imperial for the United States, Liberia and Myanmar
 * or when the tag names no region ("en"), metric for any other region.
 *
 * @example systemForLocale('en-GB') // 'metric'
 */
export function systemForLocale(tag: string | undefined): UnitSystem {
  if (!tag) return 'imperial';
  let region: string | undefined;
  try {
    region = new Intl.Locale(tag).region;
  } catch {
    return 'imperial';
  }
  return !region || IMPERIAL_REGIONS.has(region) ? 'imperial' : 'metric';
}

function read(): UnitSystem {
  try {
    const stored = window.localStorage.getItem(KEY);
    if (stored === 'metric' || stored === 'imperial') return stored;
  } catch {
    // No storage (private browsing): the choice made in this page, else the locale.
  }
  if (unsaved) return unsaved;
  return systemForLocale(typeof navigator === 'undefined' ? undefined : navigator.language);
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  const onStorage = (e: StorageEvent) => e.key === KEY && listener();
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

/** The chosen unit system and a setter that remembers the choice in this browser. */
export function useUnitPreference(): [UnitSystem, (system: UnitSystem) => void] {
  const system = useSyncExternalStore(subscribe, read, () => 'imperial' as const);
  const choose = useCallback((next: UnitSystem) => {
    try {
      window.localStorage.setItem(KEY, next);
    } catch {
      // Without storage the choice lasts until the page reloads.
      unsaved = next;
    }
    for (const listener of listeners) listener();
  }, []);
  return [system, choose];
}
