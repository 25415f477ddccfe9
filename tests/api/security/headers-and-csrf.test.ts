// Security basics: the Content-Security-Policy, and CSRF on every state-changing route.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signIn, type TestApp } from '../../helpers/app';

describe('security headers', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  it('sends a CSP that forbids inline scripts and third-party origins', async () => {
    const res = await request(t.app).get('/api/health');
    const csp = res.headers['content-security-policy'] as string;
    const directives = Object.fromEntries(
      csp
        .split(';')
        .map((d) => d.trim().split(/\s+/))
        .map(([name, ...values]) => [name, values]),
    );
    expect(directives['script-src']).toEqual(["'self'"]);
    expect(directives['default-src']).toEqual(["'self'"]);
    expect(directives['object-src']).toEqual(["'none'"]);
    expect(directives['frame-ancestors']).toEqual(["'none'"]);
    for (const values of Object.values(directives) as string[][]) {
      for (const value of values) expect(value).not.toMatch(/^https?:|\*|unsafe-eval/);
    }
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('marks the session and CSRF cookies Secure in production and never sends the session over plain HTTP', async () => {
    const prod = await createTestApp({
      NODE_ENV: 'production',
      MAIL_CATCHER: 'off',
      TRUST_PROXY: 'on',
    });
    try {
      const signInOver = async (proto: 'https' | 'http') => {
        const agent = request.agent(prod.app);
        const csrf = await agent.get('/api/auth/csrf').set('X-Forwarded-Proto', proto);
        const csrfCookie = String(csrf.headers['set-cookie']);
        expect(csrfCookie).toMatch(/sheaf\.csrf=.*; Secure/);
        expect(csrfCookie).toMatch(/HttpOnly/);
        // Secure cookies are not sent back over plain HTTP: hand it over as a browser on HTTPS would.
        const cookie = csrfCookie.split(';')[0]!;
        return agent
          .post('/api/auth/login')
          .set('X-Forwarded-Proto', proto)
          .set('Cookie', cookie)
          .set('X-CSRF-Token', csrf.body.csrfToken)
          .send({ email: 'member@millbrook.example', password: 'sheaf-demo' });
      };
      const overHttps = await signInOver('https');
      expect(overHttps.status).toBe(200);
      const session = String(overHttps.headers['set-cookie']);
      expect(session).toMatch(
        /sheaf\.sid=[^;]+; Path=\/; Expires=[^;]+; HttpOnly; Secure; SameSite=Lax/,
      );
      const overHttp = await signInOver('http');
      expect(String(overHttp.headers['set-cookie'])).not.toMatch(/sheaf\.sid=/);
    } finally {
      await prod.close();
    }
  });
});

describe('CSRF on every state-changing route', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  it('refuses every POST, PATCH, PUT and DELETE without the token, signed in or not', async () => {
    const coordinator = await signIn(t.app, 'coordinator@millbrook.example');
    const routes = (await t.routes()).filter((r) => r.method !== 'get');
    expect(routes.length).toBeGreaterThan(3);
    const failures: string[] = [];
    for (const route of routes) {
      const url = route.path.replace(/:([A-Za-z]+)/g, '00000000-0000-4000-8000-000000000000');
      for (const agent of [coordinator.agent, request.agent(t.app)]) {
        const res = await agent[route.method](url).send({});
        if (res.status !== 403 || res.body?.error?.code !== 'csrf_invalid')
          failures.push(`${route.method} ${route.path}: ${res.status}`);
      }
    }
    expect(failures).toEqual([]);
  });
});
