// @vitest-environment happy-dom
// The outbox's sender on a weak signal: a send that never answers is cut off and counted as no
// signal, so the queue moves again instead of waiting on it until the page is closed.
import { cleanup, renderHook } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import {
  discardEdits,
  queueEdit,
  setOutboxUser,
  useOutbox,
} from '../../web/features/collect/lib/outbox';
import { buildSiteStrips } from './collect-builders';

const strip = buildSiteStrips('metric').strips[0]!;

const json = (body: unknown) =>
  new Response(JSON.stringify(body), {
    status: 200,
    headers: { 'content-type': 'application/json' },
  });

afterEach(() => {
  cleanup();
  discardEdits(strip.stripId);
  setOutboxUser(null);
  vi.useRealTimers();
});

describe('outbox sender', () => {
  it('cuts off a send that hangs, then sends the edit again and empties the queue', async () => {
    vi.useFakeTimers();
    const patches: number[] = [];
    let answer = false;
    globalThis.fetch = (async (input: RequestInfo | URL, init?: RequestInit) => {
      if (String(input).endsWith('/api/auth/csrf')) return json({ csrfToken: 'token' });
      patches.push(Date.now());
      if (answer) return json({ ...strip, version: strip.version + 1 });
      // Like a request on a signal that comes and goes: no answer, until the caller gives up.
      return new Promise<Response>((_resolve, reject) => {
        init?.signal?.addEventListener('abort', () => reject(init.signal?.reason));
      });
    }) as typeof fetch;

    setOutboxUser('99999999-9999-4999-8999-999999999999');
    await vi.advanceTimersByTimeAsync(10);
    queueEdit(strip, { moisturePct: 14.5 });
    await vi.advanceTimersByTimeAsync(1000);
    expect(patches).toHaveLength(1);

    answer = true;
    // Still waiting on the first send well before the cut-off: no second request yet.
    await vi.advanceTimersByTimeAsync(15_000);
    expect(patches).toHaveLength(1);
    // Cut off at 20 s, then retried a few seconds later; the answer empties the queue.
    await vi.advanceTimersByTimeAsync(15_000);
    expect(patches).toHaveLength(2);
    expect(renderHook(() => useOutbox()).result.current).toEqual([]);
  });

  it('keeps the same list while the queue is empty, so the strips on the page are not rendered again', async () => {
    let renders = 0;
    const { result } = renderHook(() => {
      renders += 1;
      return useOutbox();
    });
    const before = result.current;
    const rendersBefore = renders;
    // Signing in reads the device's queue (none here: IndexedDB is missing in this test's
    // browser, so the queue is in memory) and empties the list in memory twice over.
    setOutboxUser('88888888-8888-4888-8888-888888888888');
    await new Promise((resolve) => setTimeout(resolve, 20));
    expect(result.current).toBe(before);
    expect(renders).toBe(rendersBefore);

    // An edit is a new list, and renders.
    globalThis.fetch = (async () => new Promise<Response>(() => undefined)) as typeof fetch;
    queueEdit(strip, { moisturePct: 13 });
    await new Promise((resolve) => setTimeout(resolve, 0));
    expect(result.current).not.toBe(before);
    expect(result.current.map((entry) => entry.stripId)).toEqual([strip.stripId]);
    expect(renders).toBeGreaterThan(rendersBefore);
  });
});
