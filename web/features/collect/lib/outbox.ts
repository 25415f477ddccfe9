/**
 * The outbox: strip edits are kept on the device (IndexedDB, per signed-in user) the moment they
 * are typed and sent to the server in the background, so nothing is lost when the signal drops,
 * the page reloads or the browser closes. Sending resumes on the browser's `online` event and on
 * a timer. A stale version (409) keeps the edit and waits for the grower to reload or overwrite.
 * Another person signing in on the same phone gets their own, empty queue.
 */
import { useEffect, useSyncExternalStore } from 'react';
import type { SessionUser } from '../../../../shared/schemas/auth';
import {
  StripSchema,
  type StripDto,
  type StripValuesPatch,
} from '../../../../shared/schemas/strip';
import { api, isApiError } from '../../../lib/api-client';
import { queryClient } from '../../../lib/query-client';
import { storeStrip } from '../api/site-strips';
import { loadEntries, saveEntries } from './outbox-store';

export type OutboxStatus = 'pending' | 'conflict' | 'locked' | 'rejected';

export interface OutboxEntry {
  stripId: string;
  siteId: string;
  /** The strip version these edits were made on. */
  baseVersion: number;
  values: StripValuesPatch;
  status: OutboxStatus;
  message?: string;
  /** The server's strip when it answered 409. */
  current?: StripDto;
  updatedAt: number;
}

const RETRY_MS = 5000;
/**
 * How long one send may take. On a weak signal a request can hang for minutes before the browser
 * gives up; until then nothing else in the queue would move. Cut off, it counts as no signal.
 */
const SEND_TIMEOUT_MS = 20_000;
const CHANNEL = 'sheaf-outbox';

/** Whose queue is in memory; null when nobody is signed in. */
let userId: string | null = null;
/** False until the device's queue of the current user has been read. */
let loaded = false;
let entries: Record<string, OutboxEntry> = {};
let snapshot: OutboxEntry[] = [];
let flushing = false;
let sending = false;
let retryTimer: ReturnType<typeof setTimeout> | null = null;
let soonTimer: ReturnType<typeof setTimeout> | null = null;
let started = false;
let writes: Promise<void> = Promise.resolve();
let channel: BroadcastChannel | null = null;
const listeners = new Set<() => void>();

function notify() {
  for (const listener of listeners) listener();
}

function setEntries(next: Record<string, OutboxEntry>) {
  entries = next;
  const list = Object.values(entries).sort((a, b) => a.updatedAt - b.updatedAt);
  // The same edits as before (an empty queue read from the device, most often): keep the list
  // React already has, so every strip on the page is not rendered again for nothing.
  if (list.length !== snapshot.length || list.some((entry, i) => entry !== snapshot[i])) {
    snapshot = list;
  }
  notify();
}

function commit(next: Record<string, OutboxEntry>) {
  const previous = entries;
  setEntries(next);
  if (!userId) return;
  const owner = userId;
  const changed = Object.values(next).filter((entry) => previous[entry.stripId] !== entry);
  const removed = Object.keys(previous).filter((stripId) => !(stripId in next));
  writes = writes
    .then(() => saveEntries(owner, changed, removed))
    .then(() => channel?.postMessage({ userId: owner }))
    .catch(() => {
      // Storage blocked (private mode, disk full): the edit still sits in memory and is sent
      // while the page is open.
    });
}

async function reload(owner: string) {
  try {
    const stored = await loadEntries(owner);
    if (userId !== owner) return;
    // Edits typed while the device queue was being read stay on top of it.
    setEntries({ ...stored, ...entries });
  } catch {
    // No IndexedDB: the queue lives in memory only.
  }
  if (userId !== owner) return;
  loaded = true;
  notify();
  void flush();
}

/** Switches the queue to the signed-in user (or to nobody); their edits are read from the device. */
export function setOutboxUser(id: string | null): void {
  if (id === userId) return;
  userId = id;
  loaded = id === null;
  setEntries({});
  if (id) void reload(id);
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

/** Keeps an edit of one strip; later edits of the same strip merge into it. */
export function queueEdit(
  strip: { stripId: string; siteId: string; version: number },
  values: StripValuesPatch,
): void {
  const existing = entries[strip.stripId];
  const entry: OutboxEntry = existing
    ? { ...existing, values: { ...existing.values, ...values }, updatedAt: Date.now() }
    : {
        stripId: strip.stripId,
        siteId: strip.siteId,
        baseVersion: strip.version,
        values,
        status: 'pending',
        updatedAt: Date.now(),
      };
  if (entry.status === 'rejected') entry.status = 'pending';
  commit({ ...entries, [strip.stripId]: entry });
  flushSoon();
}

/** Sends after a short pause, so a burst of keystrokes becomes one request. */
export function flushSoon(delay = 600): void {
  if (soonTimer) clearTimeout(soonTimer);
  soonTimer = setTimeout(() => {
    soonTimer = null;
    void flush();
  }, delay);
}

function scheduleRetry() {
  if (retryTimer) return;
  retryTimer = setTimeout(() => {
    retryTimer = null;
    void flush();
  }, RETRY_MS);
}

async function sendOne(entry: OutboxEntry): Promise<'sent' | 'offline' | 'held'> {
  const sent = entry.values;
  const owner: string | null = userId;
  // A timer and a controller rather than AbortSignal.timeout, which phones from before 2022 lack.
  const controller = new AbortController();
  const cutOff = setTimeout(
    () => controller.abort(new DOMException('No answer in time', 'TimeoutError')),
    SEND_TIMEOUT_MS,
  );
  try {
    const strip = StripSchema.parse(
      await api.patch(
        `/api/strips/${entry.stripId}`,
        { version: entry.baseVersion, values: sent },
        { signal: controller.signal },
      ),
    );
    storeStrip(queryClient, strip);
    if (userId !== owner) return 'sent';
    const latest = entries[entry.stripId];
    if (!latest) return 'sent';
    const remaining: Record<string, unknown> = {};
    for (const [key, value] of Object.entries(latest.values)) {
      if (!same(value, (sent as Record<string, unknown>)[key])) remaining[key] = value;
    }
    const next = { ...entries };
    if (Object.keys(remaining).length === 0) delete next[entry.stripId];
    else
      next[entry.stripId] = {
        ...latest,
        values: remaining as StripValuesPatch,
        baseVersion: strip.version,
      };
    commit(next);
    return 'sent';
  } catch (error) {
    if (isApiError(error, 0) || (isApiError(error) && error.status >= 500)) return 'offline';
    if (userId !== owner) return 'held';
    const latest = entries[entry.stripId] ?? entry;
    if (isApiError(error, 409)) {
      const current = StripSchema.safeParse(error.current);
      if (current.success) storeStrip(queryClient, current.data);
      commit({
        ...entries,
        [entry.stripId]: {
          ...latest,
          status: 'conflict',
          message: error.message,
          current: current.success ? current.data : undefined,
        },
      });
    } else if (isApiError(error, 423)) {
      commit({
        ...entries,
        [entry.stripId]: { ...latest, status: 'locked', message: error.message },
      });
    } else if (isApiError(error, 401)) {
      return 'offline';
    } else {
      commit({
        ...entries,
        [entry.stripId]: {
          ...latest,
          status: 'rejected',
          message: error instanceof Error ? error.message : 'Not accepted',
        },
      });
    }
    return 'held';
  } finally {
    clearTimeout(cutOff);
  }
}

/** Sends every pending edit, one strip at a time; stops at the first network failure. */
export async function flush(): Promise<void> {
  if (!userId || !loaded) return;
  if (flushing) {
    sending = true;
    return;
  }
  flushing = true;
  try {
    do {
      sending = false;
      const owner: string | null = userId;
      for (const entry of snapshot.filter((e) => e.status === 'pending')) {
        if (userId !== owner) return;
        const result = await sendOne(entry);
        if (result === 'offline') {
          scheduleRetry();
          return;
        }
      }
      if (snapshot.some((e) => e.status === 'pending')) sending = true;
    } while (sending && snapshot.some((e) => e.status === 'pending'));
  } finally {
    flushing = false;
  }
}

/** Drops my edits of a strip and shows the server's values. */
export function discardEdits(stripId: string): void {
  const next = { ...entries };
  const entry = next[stripId];
  delete next[stripId];
  commit(next);
  if (entry) void queryClient.invalidateQueries({ queryKey: ['collect', 'site', entry.siteId] });
}

/** Saves my edits over someone else's newer version. */
export function overwriteWithMine(stripId: string): void {
  const entry = entries[stripId];
  if (!entry?.current) return;
  commit({
    ...entries,
    [stripId]: {
      ...entry,
      baseVersion: entry.current.version,
      status: 'pending',
      current: undefined,
      message: undefined,
    },
  });
  void flush();
}

function signedInUser(): string | null | undefined {
  const me = queryClient.getQueryData<SessionUser | null>(['auth', 'me']);
  return me === undefined ? undefined : (me?.id ?? null);
}

function start() {
  if (started || typeof window === 'undefined') return;
  started = true;
  window.addEventListener('online', () => void flush());
  // Follow sign-in and sign-out through the cached session user; an unknown user (the query
  // cleared or still loading) keeps the current queue until the answer is known.
  const follow = () => {
    const id = signedInUser();
    if (id !== undefined) setOutboxUser(id);
  };
  queryClient.getQueryCache().subscribe((event) => {
    if (event.query.queryKey[0] === 'auth' && event.query.queryKey[1] === 'me') follow();
  });
  follow();
  if (typeof BroadcastChannel !== 'undefined') {
    channel = new BroadcastChannel(CHANNEL);
    channel.onmessage = (event: MessageEvent<{ userId: string }>) => {
      if (userId && event.data.userId === userId) void reload(userId);
    };
  }
}

/** Every edit not yet accepted by the server; starts the background sender. */
export function useOutbox(): OutboxEntry[] {
  useEffect(start, []);
  return useSyncExternalStore(
    subscribe,
    () => snapshot,
    () => snapshot,
  );
}

/** Whether the device's queue has been read (before that, "all saved" cannot be said). */
export function useOutboxLoaded(): boolean {
  useEffect(start, []);
  return useSyncExternalStore(
    subscribe,
    () => loaded,
    () => loaded,
  );
}

/** The waiting edit of one strip, if any. */
export function useStripOutbox(stripId: string | undefined): OutboxEntry | undefined {
  const all = useOutbox();
  return stripId ? all.find((e) => e.stripId === stripId) : undefined;
}
