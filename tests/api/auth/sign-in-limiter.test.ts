// The sign-in limiter counts wrong passwords per account and client address in PostgreSQL:
// the owner elsewhere is not locked out, correct passwords never count, and a second app
// (another worker process) sees the same counts.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  buildNetwork,
  createTestApp,
  DEMO_PASSWORD,
  type BuiltNetwork,
  type TestApp,
} from '../../helpers/app';

/** One sign-in attempt from a given client address (TRUST_PROXY=on reads X-Forwarded-For). */
async function signInFrom(app: string, address: string, email: string, password: string) {
  const agent = request.agent(app);
  const csrf = await agent.get('/api/auth/csrf').set('X-Forwarded-For', address);
  return agent
    .post('/api/auth/login')
    .set('X-Forwarded-For', address)
    .set('X-CSRF-Token', csrf.body.csrfToken)
    .send({ email, password });
}

/** One sign-up (which e-mails a link) from a given client address. */
async function signUpFrom(app: string, address: string, email: string) {
  const agent = request.agent(app);
  const csrf = await agent.get('/api/auth/csrf').set('X-Forwarded-For', address);
  return agent
    .post('/api/auth/sign-up')
    .set('X-Forwarded-For', address)
    .set('X-CSRF-Token', csrf.body.csrfToken)
    .send({ name: 'Limit Tester', email, password: 'long enough password', networkName: 'Limits' });
}

describe('sign-in limiter', () => {
  let t: TestApp;
  let second: TestApp;
  let net: BuiltNetwork;
  beforeAll(async () => {
    // Two API processes with the same settings, started side by side.
    [t, second] = await Promise.all([
      createTestApp({ RATE_LIMIT_LOGIN: '3', TRUST_PROXY: 'on' }),
      createTestApp({ RATE_LIMIT_LOGIN: '3', TRUST_PROXY: 'on' }),
    ]);
    net = await buildNetwork(t.dataSource, 'Limiter');
  });
  afterAll(async () => {
    await t.close();
    await second.close();
  });

  it('locks an account only from the address that guessed, and not the owner elsewhere', async () => {
    const guesser = '203.0.113.7'; // Documentation address block (RFC 5737).
    const statuses: number[] = [];
    for (let i = 0; i < 4; i += 1)
      statuses.push((await signInFrom(t.app, guesser, net.emails.member, `wrong-${i}`)).status);
    expect(statuses).toEqual([401, 401, 401, 429]);
    const rightPasswordThere = await signInFrom(t.app, guesser, net.emails.member, DEMO_PASSWORD);
    expect(rightPasswordThere.status).toBe(429);
    expect(rightPasswordThere.body.error.code).toBe('rate_limited');

    const owner = await signInFrom(t.app, '198.51.100.20', net.emails.member, DEMO_PASSWORD);
    expect(owner.status).toBe(200);
  });

  it('keeps the counts in PostgreSQL, so another worker process sees the lock', async () => {
    const guesser = '203.0.113.8';
    for (let i = 0; i < 3; i += 1)
      await signInFrom(t.app, guesser, net.emails.grower, `wrong-${i}`);
    const rows = await t.dataSource.query(
      'SELECT count(*)::int AS n FROM sign_in_failures WHERE account = $1 AND address = $2',
      [net.emails.grower, guesser],
    );
    expect(rows[0].n).toBe(3);
    const elsewhere = await signInFrom(second.app, guesser, net.emails.grower, 'wrong-again');
    expect(elsewhere.status).toBe(429);
  });

  it('never counts a correct password: 20 simultaneous sign-ins are not limited', async () => {
    const results = await Promise.all(
      Array.from({ length: 20 }, () =>
        signInFrom(t.app, '198.51.100.30', net.emails.coordinator, DEMO_PASSWORD),
      ),
    );
    const statuses = results.map((r) => r.status);
    // On a loaded test machine a few may wait too long for a database connection (503);
    // none may be refused by the limiter.
    expect(statuses.filter((s) => s === 429)).toEqual([]);
    expect(statuses.filter((s) => s === 200).length).toBeGreaterThanOrEqual(10);
    // One after another, four times the limit of correct sign-ins all succeed.
    for (let i = 0; i < 12; i += 1)
      expect(
        (await signInFrom(t.app, '198.51.100.31', net.emails.coordinator, DEMO_PASSWORD)).status,
      ).toBe(200);
    const rows = await t.dataSource.query(
      'SELECT count(*)::int AS n FROM sign_in_failures WHERE account = $1',
      [net.emails.coordinator],
    );
    expect(rows[0].n).toBe(0);
  });

  it('limits one address guessing many accounts (5 × the per-account limit)', async () => {
    const sprayer = '203.0.113.9';
    const statuses: number[] = [];
    for (let i = 0; i < 16; i += 1)
      statuses.push(
        (await signInFrom(t.app, sprayer, `nobody-${i}-${net.suffix}@test.example`, 'guess'))
          .status,
      );
    expect(statuses.slice(0, 15)).toEqual(Array(15).fill(401));
    expect(statuses[15]).toBe(429);
  });

  it('limits sign-up e-mails per client address and per inbox, in PostgreSQL', async () => {
    const tag = net.suffix;
    const client = '203.0.113.20';
    const fromOneClient: number[] = [];
    for (let i = 0; i < 4; i += 1)
      fromOneClient.push((await signUpFrom(t.app, client, `one-${i}-${tag}@test.example`)).status);
    expect(fromOneClient).toEqual([202, 202, 202, 429]);

    // Many clients writing one inbox: the fourth is refused, on the other server process too.
    const inbox = `target-${tag}@test.example`;
    const toOneInbox: number[] = [];
    for (let i = 0; i < 3; i += 1)
      toOneInbox.push((await signUpFrom(t.app, `198.51.100.${60 + i}`, inbox)).status);
    toOneInbox.push((await signUpFrom(second.app, '198.51.100.70', inbox)).status);
    expect(toOneInbox).toEqual([202, 202, 202, 429]);
    const refused = await signUpFrom(second.app, '198.51.100.71', inbox.toUpperCase());
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe('rate_limited');
    // Another client and another inbox are not affected.
    expect((await signUpFrom(t.app, '198.51.100.72', `other-${tag}@test.example`)).status).toBe(
      202,
    );
  });
});
