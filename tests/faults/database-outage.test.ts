import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signIn, type TestApp } from '../helpers/app';
import { startTestCluster, stopTestCluster } from '../helpers/postgres';

async function eventually<T>(
  probe: () => Promise<T>,
  ok: (value: T) => boolean,
  timeoutMs = 20_000,
): Promise<T> {
  const started = Date.now();
  let last: T = await probe();
  while (!ok(last)) {
    if (Date.now() - started > timeoutMs) return last;
    await new Promise((r) => setTimeout(r, 250));
    last = await probe();
  }
  return last;
}

describe('PostgreSQL stopped while the server runs', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(async () => {
    await t.close();
  });

  it('answers 503 JSON quickly while the database is down and recovers in the same process', async () => {
    const coordinator = await signIn(t.app, 'coordinator@millbrook.example');
    expect((await coordinator.get('/api/trials')).status).toBe(200);

    stopTestCluster();
    try {
      const startedAt = Date.now();
      const health = await request(t.app).get('/api/health');
      expect(health.status).toBe(503);
      expect(health.body).toEqual({ status: 'degraded', db: 'down' });

      const trials = await coordinator.get('/api/trials');
      expect(trials.status).toBe(503);
      expect(trials.body.error.code).toBe('service_unavailable');
      // No hang: both answers came well within the pool's connection timeout budget.
      expect(Date.now() - startedAt).toBeLessThan(10_000);
    } finally {
      startTestCluster();
    }

    const healthy = await eventually(
      () => request(t.app).get('/api/health'),
      (res) => res.status === 200,
    );
    expect(healthy.body).toEqual({ status: 'ok', db: 'ok' });
    const again = await eventually(
      () => coordinator.get('/api/trials'),
      (res) => res.status === 200,
    );
    expect(again.status).toBe(200);
    expect(
      again.body.some((trial: { name: string }) => trial.name === 'Hulless oat seeding rate 2027'),
    ).toBe(true);
  });
});
