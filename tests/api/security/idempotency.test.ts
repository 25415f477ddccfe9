// Creating requests with an Idempotency-Key: parallel and repeated submits make one record and
// all get the first answer.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  buildNetwork,
  signIn,
  createTestApp,
  type BuiltNetwork,
  type Client,
  type TestApp,
} from '../../helpers/app';
import { completeDesign } from '../trials/builders';

describe('Idempotency-Key', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let coordinator: Client;
  beforeAll(async () => {
    t = await createTestApp();
    net = await buildNetwork(t.dataSource, 'Idempotency');
    coordinator = await signIn(t.app, net.emails.coordinator);
  });
  afterAll(() => t.close());

  async function postTrial(name: string, key?: string) {
    const token = await coordinator.csrf();
    const req = coordinator.agent.post('/api/trials').set('X-CSRF-Token', token);
    if (key) req.set('Idempotency-Key', key);
    return req.send(completeDesign({ name, networkId: net.networkId }));
  }

  async function trialsNamed(name: string): Promise<number> {
    const rows = await t.dataSource.query('SELECT count(*)::int AS n FROM trials WHERE name = $1', [
      name,
    ]);
    return rows[0].n;
  }

  it('makes one trial from five parallel identical POSTs with one key', async () => {
    const name = `Double submit ${net.suffix}`;
    const key = `form-${net.suffix}-1`;
    const answers = await Promise.all(Array.from({ length: 5 }, () => postTrial(name, key)));
    expect(answers.map((a) => a.status)).toEqual(Array(5).fill(201));
    expect(new Set(answers.map((a) => a.body.id)).size).toBe(1);
    expect(await trialsNamed(name)).toBe(1);
    // A later repeat (a retry after a lost answer) gets the same answer.
    const later = await postTrial(name, key);
    expect(later.status).toBe(201);
    expect(later.body.id).toBe(answers[0]!.body.id);
    expect(later.headers['idempotent-replayed']).toBe('true');
  });

  it('makes a record per request without a key (the test can tell the difference)', async () => {
    const name = `No key ${net.suffix}`;
    await Promise.all([postTrial(name), postTrial(name)]);
    expect(await trialsNamed(name)).toBe(2);
  });

  it('refuses a key reused for a different request, naming the header', async () => {
    const key = `form-${net.suffix}-2`;
    expect((await postTrial(`First ${net.suffix}`, key)).status).toBe(201);
    const reused = await postTrial(`Second ${net.suffix}`, key);
    expect(reused.status).toBe(422);
    expect(reused.body.error.fields).toHaveProperty('Idempotency-Key');
  });

  it('keeps keys in PostgreSQL for 24 hours', async () => {
    const key = `form-${net.suffix}-3`;
    await postTrial(`Kept ${net.suffix}`, key);
    // The answer is stored as the response finishes: give it a moment.
    let rows: { status: number | null }[] = [];
    for (let i = 0; i < 40; i += 1) {
      rows = await t.dataSource.query('SELECT status FROM idempotency_keys WHERE key = $1', [key]);
      if (rows[0]?.status) break;
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    expect(rows).toHaveLength(1);
    expect(rows[0]?.status).toBe(201);
    await t.dataSource.query(
      `UPDATE idempotency_keys SET created_at = now() - interval '25 hours' WHERE key = $1`,
      [key],
    );
    const after = await postTrial(`Kept ${net.suffix}`, key);
    expect(after.headers['idempotent-replayed']).toBeUndefined();
    expect(await trialsNamed(`Kept ${net.suffix}`)).toBe(2);
  });
});
