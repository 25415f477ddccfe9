import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  buildNetwork,
  clientFor,
  createTestApp,
  signIn,
  type BuiltNetwork,
  type TestApp,
} from '../../helpers/app';

function linkToken(text: string, prefix: string): string {
  const match = new RegExp(`${prefix}/([A-Za-z0-9_-]+)`).exec(text);
  if (!match?.[1]) throw new Error(`no ${prefix} link in: ${text}`);
  return match[1];
}

describe('password reset by e-mail', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  beforeAll(async () => {
    t = await createTestApp();
    net = await buildNetwork(t.dataSource, 'Reset');
  });
  afterAll(() => t.close());

  it('e-mails a single-use link that sets a new password', async () => {
    const client = clientFor(t.app);
    const asked = await client.post('/api/auth/password-reset', { email: net.emails.grower });
    expect(asked.status).toBe(202);
    const mail = await t.mailCatcher.waitFor(
      (m) => m.to.includes(net.emails.grower) && /reset/i.test(m.subject),
    );
    expect(mail.html).toContain('http://sheaf.test/reset/');
    const token = linkToken(mail.text, 'http://sheaf.test/reset');

    const done = await client.post('/api/auth/password-reset/complete', {
      token,
      password: 'a-new-harvest-password',
    });
    expect(done.status).toBe(204);
    await expect(signIn(t.app, net.emails.grower, 'a-new-harvest-password')).resolves.toBeDefined();
    const oldPassword = await clientFor(t.app).post('/api/auth/login', {
      email: net.emails.grower,
      password: 'sheaf-demo',
    });
    expect(oldPassword.status).toBe(401);

    const again = await client.post('/api/auth/password-reset/complete', {
      token,
      password: 'yet-another-password',
    });
    expect(again.status).toBe(400);
    expect(again.body.error.fields).toHaveProperty('token');
  });

  it('rejects an expired token', async () => {
    await clientFor(t.app).post('/api/auth/password-reset', { email: net.emails.member });
    const mail = await t.mailCatcher.waitFor((m) => m.to.includes(net.emails.member));
    const token = linkToken(mail.text, 'http://sheaf.test/reset');
    await t.dataSource.query(
      `UPDATE password_reset_tokens SET expires_at = now() - interval '1 minute'
        WHERE user_id = (SELECT id FROM users WHERE email = $1)`,
      [net.emails.member],
    );
    const res = await clientFor(t.app).post('/api/auth/password-reset/complete', {
      token,
      password: 'too-late-password',
    });
    expect(res.status).toBe(400);
  });

  it('answers 202 for an unknown address and sends nothing', async () => {
    const email = `ghost-${net.suffix}@test.example`;
    const res = await clientFor(t.app).post('/api/auth/password-reset', { email });
    expect(res.status).toBe(202);
    await new Promise((r) => setTimeout(r, 300));
    expect((await t.mailCatcher.list()).some((m) => m.to.includes(email))).toBe(false);
  });

  it('lets an admin read caught e-mail and refuses others', async () => {
    const admin = await signIn(t.app, net.emails.admin);
    const list = await admin.get('/api/admin/mail');
    expect(list.status).toBe(200);
    expect(Array.isArray(list.body)).toBe(true);
    const coordinator = await signIn(t.app, net.emails.coordinator);
    expect((await coordinator.get('/api/admin/mail')).status).toBe(403);
  });
});
