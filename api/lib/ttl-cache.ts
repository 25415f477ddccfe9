// A tiny time-limited cache for per-request lookups that rarely change (session, user,
// memberships). Two seconds is short enough that a role change or a password reset takes
// effect almost at once, and long enough that a busy page does not ask PostgreSQL the same
// question on every request. A Map with expiry times; no package needed.
export function createTtlCache<V>(ttlMs = 2000, maxEntries = 5000) {
  const entries = new Map<string, { value: V; expires: number }>();
  return {
    get(key: string): V | undefined {
      const entry = entries.get(key);
      if (!entry) return undefined;
      if (entry.expires < Date.now()) {
        entries.delete(key);
        return undefined;
      }
      return entry.value;
    },
    set(key: string, value: V) {
      if (entries.size >= maxEntries) entries.delete(entries.keys().next().value as string);
      entries.set(key, { value, expires: Date.now() + ttlMs });
    },
    delete: (key: string) => entries.delete(key),
    clear: () => entries.clear(),
  };
}
