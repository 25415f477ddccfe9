// A small in-process cache of computed report bodies. The key is a digest of everything the
// report is computed from that changes without a data_version bump (trial design, site rows,
// photo list, query); strip data changes always bump sites.data_version, which is in the site
// rows. Written here rather than pulled in as a package because it is a Map with an eviction
// order, ~20 lines.
import crypto from 'node:crypto';

export function digestOf(...parts: unknown[]): string {
  const hash = crypto.createHash('sha1');
  for (const part of parts) hash.update(JSON.stringify(part) ?? 'undefined').update('\u0000');
  return hash.digest('base64url');
}

export function createReportCache<T>(maxEntries = 300) {
  const entries = new Map<string, T>();
  return {
    async getOrCompute(key: string, compute: () => Promise<T>): Promise<T> {
      const hit = entries.get(key);
      if (hit !== undefined) {
        // Refresh recency: Map iteration order is insertion order.
        entries.delete(key);
        entries.set(key, hit);
        return hit;
      }
      const value = await compute();
      entries.set(key, value);
      if (entries.size > maxEntries) entries.delete(entries.keys().next().value as string);
      return value;
    },
    clear: () => entries.clear(),
  };
}
