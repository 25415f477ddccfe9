// Read caches that stay exact for writes made by this process: an entry is served only while
// the data generation (db/data-changes.ts) is the one it was computed in, so the next read after
// any write recomputes. maxAgeMs bounds how long a write from another process (psql, a restore)
// can go unseen. Concurrent misses for one key share one computation. A Map in insertion order
// is the eviction list. Written here rather than taken from lru-cache: its fetch() shares
// concurrent misses and refreshes stale entries, but has no notion of a write generation and no
// hard age limit beside an earlier background refresh, and those two rules are the point here.
import { dataGeneration } from '../../db/data-changes';

export interface FreshCacheOptions {
  maxEntries?: number;
  maxAgeMs?: number;
  /**
   * After this age a hit is still served, and a fresh value is computed in the background: a busy
   * route then never waits for an expiry. Defaults to half of maxAgeMs.
   */
  refreshAfterMs?: number;
  /** For facts that never change once written (which network a site belongs to): keep across writes. */
  keepAcrossWrites?: boolean;
}

interface Entry<V> {
  value: Promise<V>;
  generation: number;
  created: number;
  refreshing: boolean;
}

export function createFreshCache<V>(options: FreshCacheOptions = {}) {
  const { maxEntries = 2000, maxAgeMs = 5000, keepAcrossWrites = false } = options;
  const refreshAfterMs = options.refreshAfterMs ?? maxAgeMs / 2;
  const entries = new Map<string, Entry<V>>();
  const current = (entry: Entry<V>) => keepAcrossWrites || entry.generation === dataGeneration();
  // Counts delete() calls: a background refresh that started before one (a session read racing a
  // sign-in that rewrote the session) must not put the old value back.
  let deletions = 0;

  function store(key: string, entry: Entry<V>) {
    entries.delete(key);
    entries.set(key, entry);
    if (entries.size > maxEntries) entries.delete(entries.keys().next().value as string);
  }

  /** Computes a value; in the foreground it is shared at once, in the background only once done. */
  function load(key: string, compute: () => Promise<V>, previous?: Entry<V>): Entry<V> {
    const deletionsAtStart = deletions;
    const entry: Entry<V> = {
      value: compute(),
      generation: dataGeneration(),
      created: Date.now(),
      refreshing: false,
    };
    if (!previous) store(key, entry);
    entry.value.then(
      () => {
        // A write during the computation may or may not be in the value: do not keep it.
        if (previous) {
          if (current(entry) && deletions === deletionsAtStart) store(key, entry);
        } else if (!current(entry) && entries.get(key) === entry) entries.delete(key);
      },
      () => {
        if (previous) previous.refreshing = false;
        else if (entries.get(key) === entry) entries.delete(key);
      },
    );
    return entry;
  }

  return {
    get(key: string, compute: () => Promise<V>): Promise<V> {
      const hit = entries.get(key);
      const age = hit ? Date.now() - hit.created : Infinity;
      if (hit && age < maxAgeMs && current(hit)) {
        if (age > refreshAfterMs && !hit.refreshing) {
          hit.refreshing = true;
          load(key, compute, hit);
        }
        return hit.value;
      }
      return load(key, compute).value;
    },
    delete(key: string) {
      deletions += 1;
      entries.delete(key);
    },
  };
}

/**
 * For session, user and membership lookups: answered from memory for 2 s, across writes. Short
 * enough that a sign-out elsewhere or a role change takes effect almost at once, long enough that
 * a busy page does not ask PostgreSQL the same question on every request.
 */
export const SHORT_LIVED: FreshCacheOptions = {
  keepAcrossWrites: true,
  maxAgeMs: 2000,
  maxEntries: 5000,
};
