// The CSRF token is a signed double-submit cookie: an anonymous visitor gets one without a
// session row, and it changes at sign-in (the old one is refused afterwards).
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, DEMO_PASSWORD, type TestApp } from '../../helpers/app';

describe('CSRF token', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  it('gives an anonymous visitor a token without creating a session', async () => {
    const res = await request(t.app).get('/api/auth/csrf');
    expect(res.status).toBe(200);
    expect(res.body.csrfToken).toMatch(/^[\w-]+\.[\w-]+$/);
    const cookies = String(res.headers['set-cookie']);
    expect(cookies).toMatch(/sheaf\.csrf=/);
    expect(cookies).not.toMatch(/sheaf\.sid=/);
  });

  it('changes the token at sign-in and refuses the old one afterwards', async () => {
    const agent = request.agent(t.app);
    const before = (await agent.get('/api/auth/csrf')).body.csrfToken as string;
    const login = await agent
      .post('/api/auth/login')
      .set('X-CSRF-Token', before)
      .send({ email: 'member@millbrook.example', password: DEMO_PASSWORD });
    expect(login.status).toBe(200);
    const after = (await agent.get('/api/auth/csrf')).body.csrfToken as string;
    expect(after).not.toBe(before);
    expect(login.headers['x-csrf-token']).toBe(after);

    // The old cookie value and header together, as a page loaded before sign-in would send.
    const stale = await request(t.app)
      .post('/api/auth/logout')
      .set('Cookie', [
        `sheaf.csrf=${before}`,
        String(login.headers['set-cookie']).match(/sheaf\.sid=[^;]+/)![0],
      ])
      .set('X-CSRF-Token', before);
    expect(stale.status).toBe(403);
    expect(stale.body.error.code).toBe('csrf_invalid');
    const fresh = await agent.post('/api/auth/logout').set('X-CSRF-Token', after);
    expect(fresh.status).toBe(204);
  });

  it('refuses a token that was not signed by the server', async () => {
    const agent = request.agent(t.app);
    const forged = 'made-up-nonce.made-up-signature';
    const res = await agent
      .post('/api/auth/login')
      .set('Cookie', `sheaf.csrf=${forged}`)
      .set('X-CSRF-Token', forged)
      .send({ email: 'member@millbrook.example', password: DEMO_PASSWORD });
    expect(res.status).toBe(403);
  });
});
