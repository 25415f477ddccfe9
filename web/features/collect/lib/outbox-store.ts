/**
 * Where unsent strip edits live on the device: IndexedDB, one record per (user, strip), so they
 * survive closing the browser and another person signing in on the same phone never reads them.
 */
import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { OutboxEntry } from './outbox';

export interface StoredEntry extends OutboxEntry {
  userId: string;
}

interface OutboxDb extends DBSchema {
  edits: { key: [string, string]; value: StoredEntry; indexes: { byUser: string } };
}

const DB_NAME = 'sheaf-outbox';
/** The queue before it moved to IndexedDB; it had no owner, so the next signed-in user adopts it. */
const LEGACY_KEY = 'sheaf.collect.outbox.v1';

let dbPromise: Promise<IDBPDatabase<OutboxDb>> | null = null;

function db(): Promise<IDBPDatabase<OutboxDb>> {
  dbPromise ??= openDB<OutboxDb>(DB_NAME, 1, {
    upgrade(database) {
      const store = database.createObjectStore('edits', { keyPath: ['userId', 'stripId'] });
      store.createIndex('byUser', 'userId');
    },
  });
  return dbPromise;
}

function takeLegacy(): OutboxEntry[] {
  try {
    const raw = localStorage.getItem(LEGACY_KEY);
    if (!raw) return [];
    localStorage.removeItem(LEGACY_KEY);
    return Object.values(JSON.parse(raw) as Record<string, OutboxEntry>);
  } catch {
    return [];
  }
}

/** Every waiting edit of one user. */
export async function loadEntries(userId: string): Promise<Record<string, OutboxEntry>> {
  const database = await db();
  const legacy = takeLegacy();
  if (legacy.length > 0) {
    const tx = database.transaction('edits', 'readwrite');
    await Promise.all([...legacy.map((e) => tx.store.put({ ...e, userId })), tx.done]);
  }
  const rows = await database.getAllFromIndex('edits', 'byUser', userId);
  return Object.fromEntries(
    rows.map(({ userId: _owner, ...entry }) => [entry.stripId, entry as OutboxEntry]),
  );
}

/** Writes one user's changed and removed edits in one transaction. */
export async function saveEntries(
  userId: string,
  changed: readonly OutboxEntry[],
  removed: readonly string[],
): Promise<void> {
  const database = await db();
  const tx = database.transaction('edits', 'readwrite');
  await Promise.all([
    ...changed.map((entry) => tx.store.put({ ...entry, userId })),
    ...removed.map((stripId) => tx.store.delete([userId, stripId])),
    tx.done,
  ]);
}
