// Caught mail is a development aid that must not cross networks: each admin reads only mail to
// people of the networks they administer, and outside development (or off loopback) the route is gone.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { servesCaughtMail } from '../../../api/admin/admin.router';
import type { CaughtMail } from '../../../shared/schemas/auth';
import {
  buildNetwork,
  clientFor,
  createTestApp,
  signIn,
  type BuiltNetwork,
  type TestApp,
} from '../../helpers/app';

let t: TestApp;
let north: BuiltNetwork;
let south: BuiltNetwork;
beforeAll(async () => {
  t = await createTestApp();
  north = await buildNetwork(t.dataSource, 'North mail');
  south = await buildNetwork(t.dataSource, 'South mail');
});
afterAll(() => t.close());

describe('GET /api/admin/mail', () => {
  it("shows an admin the mail of their own network and none of another network's", async () => {
    for (const email of [north.emails.grower, south.emails.grower]) {
      await clientFor(t.app).post('/api/auth/password-reset', { email });
      await t.mailCatcher.waitFor((m) => m.to.includes(email));
    }
    const northAdmin = await signIn(t.app, north.emails.admin);
    const seen = (await northAdmin.get('/api/admin/mail')).body as CaughtMail[];
    const recipients = seen.flatMap((m) => m.to);
    expect(recipients).toContain(north.emails.grower);
    expect(recipients).not.toContain(south.emails.grower);
    expect(recipients.every((to) => to.endsWith(`${north.suffix}@test.example`))).toBe(true);
  });

  it('refuses coordinators and anonymous callers', async () => {
    const coordinator = await signIn(t.app, north.emails.coordinator);
    expect((await coordinator.get('/api/admin/mail')).status).toBe(403);
    expect((await request(t.app).get('/api/admin/mail')).status).toBe(401);
  });

  it('does not exist in production mode', async () => {
    const production = await createTestApp({ NODE_ENV: 'production' });
    try {
      const res = await request(production.app).get('/api/admin/mail');
      expect(res.status).toBe(404);
    } finally {
      await production.close();
    }
  });

  it('is served only in development or tests, on loopback, with a catcher configured', () => {
    const base = {
      NODE_ENV: 'development',
      HOST: '127.0.0.1',
      MAIL_CATCHER_URL: 'http://127.0.0.1:2526',
    };
    expect(servesCaughtMail(base)).toBe(true);
    expect(servesCaughtMail({ ...base, NODE_ENV: 'production' })).toBe(false);
    expect(servesCaughtMail({ ...base, HOST: '0.0.0.0' })).toBe(false);
    expect(servesCaughtMail({ ...base, MAIL_CATCHER_URL: undefined })).toBe(false);
  });
});
