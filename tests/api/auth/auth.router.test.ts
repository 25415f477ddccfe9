import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  buildNetwork,
  clientFor,
  createTestApp,
  signIn,
  type BuiltNetwork,
  type TestApp,
} from '../../helpers/app';

describe('sign-in, sessions and CSRF', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  beforeAll(async () => {
    t = await createTestApp();
    net = await buildNetwork(t.dataSource, 'Auth tests');
  });
  afterAll(() => t.close());

  it('signs in the demo coordinator and returns the user with memberships', async () => {
    const client = clientFor(t.app);
    const res = await client.post('/api/auth/login', {
      email: 'coordinator@millbrook.example',
      password: 'sheaf-demo',
    });
    expect(res.status).toBe(200);
    expect(res.body.email).toBe('coordinator@millbrook.example');
    expect(res.body.memberships).toEqual([expect.objectContaining({ role: 'coordinator' })]);
    expect(res.body).not.toHaveProperty('passwordHash');
  });

  it('sets an httpOnly, SameSite=Lax session cookie and rotates the session id on sign-in', async () => {
    const client = clientFor(t.app);
    const before = await client.get('/api/auth/csrf');
    const firstCookie = String(before.headers['set-cookie']);
    const res = await client.post('/api/auth/login', {
      email: net.emails.grower,
      password: 'sheaf-demo',
    });
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/sheaf\.sid=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/);
    const sid = (c: string) => /sheaf\.sid=([^;]+)/.exec(c)?.[1];
    expect(sid(cookie)).toBeDefined();
    expect(sid(cookie)).not.toBe(sid(firstCookie));
  });

  it('returns the same 401 message for an unknown e-mail and a wrong password', async () => {
    const wrongPassword = await clientFor(t.app).post('/api/auth/login', {
      email: net.emails.member,
      password: 'not-it',
    });
    const unknown = await clientFor(t.app).post('/api/auth/login', {
      email: `nobody-${net.suffix}@test.example`,
      password: 'not-it',
    });
    expect(wrongPassword.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(unknown.body).toEqual(wrongPassword.body);
    expect(wrongPassword.body.error.code).toBe('unauthenticated');
  });

  it('answers 400 with the field named when the e-mail is malformed', async () => {
    const res = await clientFor(t.app).post('/api/auth/login', {
      email: 'not-an-address',
      password: 'x',
    });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.fields).toHaveProperty('email');
  });

  it('answers /me with 401 when signed out and the user when signed in', async () => {
    const anonymous = await request(t.app).get('/api/auth/me');
    expect(anonymous.status).toBe(401);
    expect(anonymous.body.error.code).toBe('unauthenticated');
    const client = await signIn(t.app, net.emails.member);
    const me = await client.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.email).toBe(net.emails.member);
  });

  it('signs out and forgets the session', async () => {
    const client = await signIn(t.app, net.emails.member);
    const out = await client.post('/api/auth/logout');
    expect(out.status).toBe(204);
    expect((await client.get('/api/auth/me')).status).toBe(401);
  });

  it('rejects a state-changing request without the CSRF header with 403', async () => {
    const client = await signIn(t.app, net.emails.coordinator);
    const res = await client.agent.post('/api/auth/logout').send({});
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_invalid');
    const wrong = await client.agent
      .post('/api/auth/logout')
      .set('X-CSRF-Token', 'forged-token')
      .send({});
    expect(wrong.status).toBe(403);
    expect((await client.get('/api/auth/me')).status).toBe(200);
  });

  // A session surviving a restart of the server process: tests/faults/server-process.test.ts.

  it('never leaks a stack trace in an error body', async () => {
    const res = await request(t.app)
      .post('/api/auth/login')
      .set('Content-Type', 'application/json')
      .send('{"broken json');
    expect([400, 403]).toContain(res.status);
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.ts:\d+/);
    expect(res.body.error).toHaveProperty('code');
  });
});

describe('sign-in rate limit', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  beforeAll(async () => {
    t = await createTestApp({ RATE_LIMIT_LOGIN: '3' });
    net = await buildNetwork(t.dataSource, 'Rate limit');
  });
  afterAll(() => t.close());

  it('answers 429 after too many failed attempts on one account', async () => {
    const client = clientFor(t.app);
    const statuses: number[] = [];
    for (let i = 0; i < 5; i += 1) {
      statuses.push(
        (await client.post('/api/auth/login', { email: net.emails.member, password: `wrong-${i}` }))
          .status,
      );
    }
    expect(statuses.slice(0, 3)).toEqual([401, 401, 401]);
    expect(statuses[4]).toBe(429);
    const limited = await client.post('/api/auth/login', {
      email: net.emails.member,
      password: 'sheaf-demo',
    });
    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe('rate_limited');
  });
});
