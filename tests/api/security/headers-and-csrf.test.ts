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

  it('marks the session cookie Secure in production and never sends it over plain HTTP', async () => {
    const prod = await createTestApp({
      NODE_ENV: 'production',
      MAIL_CATCHER: 'off',
      TRUST_PROXY: 'on',
    });
    try {
      const overHttps = await request(prod.app)
        .get('/api/auth/csrf')
        .set('X-Forwarded-Proto', 'https');
      const cookie = String(overHttps.headers['set-cookie']);
      expect(cookie).toMatch(/sheaf\.sid=/);
      expect(cookie).toMatch(/; Secure/);
      expect(cookie).toMatch(/HttpOnly/);
      const overHttp = await request(prod.app).get('/api/auth/csrf');
      expect(overHttp.headers['set-cookie']).toBeUndefined();
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
    const routes = t.routes.filter((r) => r.method !== 'get');
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
