import fs from 'node:fs';
import path from 'node:path';
import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  buildNetwork,
  clientFor,
  createTestApp,
  signIn,
  type Client,
  type TestApp,
} from '../../helpers/app';
import { buildActiveTrial, enrol } from '../trials/builders';

function confirmationToken(text: string): string {
  const match = /\/sign-up\/confirm\/([A-Za-z0-9_-]+)/.exec(text);
  if (!match) throw new Error(`no confirmation link in: ${text}`);
  return match[1]!;
}

/** Signs up through the API and the e-mailed link; returns the signed-in client. */
async function signUpAndConfirm(t: TestApp, name: string, networkName: string) {
  const email = `${name.toLowerCase().replace(/\W+/g, '-')}-${crypto.randomBytes(3).toString('hex')}@test.example`;
  const client = clientFor(t.app);
  const res = await client.post('/api/auth/sign-up', {
    name,
    email,
    password: 'long enough password',
    networkName,
  });
  expect(res.status).toBe(202);
  const mail = await t.mailCatcher.waitFor((m) => m.to.includes(email));
  const confirmed = await client.post('/api/auth/sign-up/confirm', {
    token: confirmationToken(mail.text),
  });
  expect(confirmed.status).toBe(201);
  return { client, email, me: confirmed.body, mail };
}

describe('starting networks and belonging to several', () => {
  let t: TestApp;

  beforeAll(async () => {
    t = await createTestApp();
  });
  afterAll(() => t.close());

  it('signs up, confirms the e-mail by its link and becomes the admin of the new network', async () => {
    const { client, email, me, mail } = await signUpAndConfirm(t, 'Ina Bell', 'Ridge Grain Group');
    expect(mail.subject).toMatch(/Confirm your e-mail/);
    expect(me).toMatchObject({
      email,
      name: 'Ina Bell',
      memberships: [{ networkName: 'Ridge Grain Group', role: 'admin' }],
    });
    expect((await client.get('/api/auth/me')).status).toBe(200);
    // The link works once.
    const again = await clientFor(t.app).post('/api/auth/sign-up/confirm', {
      token: confirmationToken(mail.text),
    });
    expect(again.status).toBe(400);
    expect(again.body.error.fields.token).toBeDefined();
  });

  it('creates nothing before the link is opened', async () => {
    const email = `unconfirmed-${crypto.randomBytes(3).toString('hex')}@test.example`;
    const client = clientFor(t.app);
    await client.post('/api/auth/sign-up', {
      name: 'Not Yet',
      email,
      password: 'long enough password',
      networkName: 'Never Confirmed Circle',
    });
    const users = await t.dataSource.query('SELECT 1 FROM users WHERE email = $1', [email]);
    const networks = await t.dataSource.query('SELECT 1 FROM networks WHERE name = $1', [
      'Never Confirmed Circle',
    ]);
    expect(users).toEqual([]);
    expect(networks).toEqual([]);
    const login = await client.post('/api/auth/login', { email, password: 'long enough password' });
    expect(login.status).toBe(401);
  });

  it('answers an address that already has an account the same, and tells its owner by e-mail', async () => {
    const net = await buildNetwork(t.dataSource, 'Existing');
    const res = await clientFor(t.app).post('/api/auth/sign-up', {
      name: 'Someone',
      email: net.emails.grower,
      password: 'long enough password',
      networkName: 'Second Try Circle',
    });
    expect(res.status).toBe(202);
    const mail = await t.mailCatcher.waitFor((m) => m.to.includes(net.emails.grower));
    expect(mail.subject).toMatch(/already have/);
  });

  it('answers 400 naming each bad field', async () => {
    const res = await clientFor(t.app).post('/api/auth/sign-up', {
      name: '',
      email: 'not-an-address',
      password: 'short',
      networkName: 'x',
    });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual([
      'email',
      'name',
      'networkName',
      'password',
    ]);
  });

  it('keeps two networks side by side apart, and lets one person belong to both', async () => {
    const ina = await signUpAndConfirm(t, 'Ina Bell', 'North Circle');
    const north = ina.me.memberships[0].networkId as string;
    const started = await ina.client.post('/api/networks', { name: 'South Circle' });
    expect(started.status).toBe(201);
    const south = started.body.id as string;
    const mine = await ina.client.get('/api/networks');
    expect(mine.body.map((n: { name: string }) => n.name)).toEqual([
      'North Circle',
      'South Circle',
    ]);

    const northTrial = await buildActiveTrial(ina.client, north, { name: 'North oats' });
    const southTrial = await buildActiveTrial(ina.client, south, { name: 'South wheat' });
    const list = await ina.client.get('/api/trials');
    const byName = Object.fromEntries(
      list.body.map((tr: { name: string; networkId: string }) => [tr.name, tr.networkId]),
    );
    expect(byName).toMatchObject({ 'North oats': north, 'South wheat': south });

    // A grower invited to the south network sees nothing of the north one.
    const southPeople = await buildNetwork(t.dataSource, 'South helpers');
    await t.dataSource.query(
      `INSERT INTO memberships (user_id, network_id, role) VALUES ($1, $2, 'grower')`,
      [southPeople.userIds.grower, south],
    );
    const southSite = await enrol(ina.client, southTrial, {
      growerUserId: southPeople.userIds.grower,
    });
    const grower = await signIn(t.app, southPeople.emails.grower);
    expect((await grower.get(`/api/sites/${southSite}`)).status).toBe(200);
    expect((await grower.get(`/api/trials/${northTrial}`)).status).toBe(404);
    expect((await grower.get(`/api/networks/${north}/people`)).status).toBe(404);
    const growerTrials = await grower.get('/api/trials');
    expect(growerTrials.body.map((tr: { id: string }) => tr.id)).not.toContain(northTrial);
    // Someone else's sign-up cannot enrol a person of another network.
    const other = await signUpAndConfirm(t, 'Tom Reed', 'West Circle');
    const westTrial = await buildActiveTrial(other.client, other.me.memberships[0].networkId);
    const crossed = await other.client.post(`/api/trials/${westTrial}/sites`, {
      fieldName: 'Borrowed',
      growerUserId: southPeople.userIds.grower,
    });
    expect(crossed.status).toBe(400);
  });

  it('deletes a network after its name is typed, and leaves nothing of it behind', async () => {
    const ina = await signUpAndConfirm(t, 'Ina Bell', 'Short Lived Circle');
    const networkId = ina.me.memberships[0].networkId as string;
    const helpers = await buildNetwork(t.dataSource, 'Helpers');
    await t.dataSource.query(
      `INSERT INTO memberships (user_id, network_id, role) VALUES ($1, $2, 'coordinator'), ($3, $2, 'grower')`,
      [helpers.userIds.coordinator, networkId, helpers.userIds.grower],
    );
    const lonely = `lonely-${crypto.randomBytes(3).toString('hex')}@test.example`;
    const [lonelyUser] = await t.dataSource.query(
      `INSERT INTO users (email, name, password_hash) VALUES ($1, 'Only here', 'x') RETURNING id`,
      [lonely],
    );
    await t.dataSource.query(
      `INSERT INTO memberships (user_id, network_id, role) VALUES ($1, $2, 'member')`,
      [lonelyUser.id, networkId],
    );
    const trialId = await buildActiveTrial(ina.client, networkId);
    const siteId = await enrol(ina.client, trialId, { growerUserId: helpers.userIds.grower });
    expect((await ina.client.post(`/api/sites/${siteId}/randomize`, {})).status).toBe(200);
    await ina.client.post(`/api/networks/${networkId}/invitations`, {
      email: `invited-${crypto.randomBytes(3).toString('hex')}@test.example`,
      role: 'member',
    });
    const folder = path.resolve(t.config.UPLOAD_DIR);
    fs.mkdirSync(folder, { recursive: true });
    const storedName = `${crypto.randomUUID()}.png`;
    fs.writeFileSync(path.join(folder, storedName), 'not really a png');
    await t.dataSource.query(
      `INSERT INTO attachments (site_id, stored_name, original_name, mime_type, size_bytes) VALUES ($1, $2, 'a.png', 'image/png', 16)`,
      [siteId, storedName],
    );

    const coordinator = await signIn(t.app, helpers.emails.coordinator);
    const byCoordinator = await coordinator.delete(`/api/networks/${networkId}`);
    expect(byCoordinator.status).toBe(400); // no name typed
    const wrongRole = await coordinator.agent
      .delete(`/api/networks/${networkId}`)
      .set('X-CSRF-Token', await coordinator.csrf())
      .send({ confirmName: 'Short Lived Circle' });
    expect(wrongRole.status).toBe(403);
    const wrongName = await ina.client.agent
      .delete(`/api/networks/${networkId}`)
      .set('X-CSRF-Token', await ina.client.csrf())
      .send({ confirmName: 'Short lived' });
    expect(wrongName.status).toBe(400);
    expect(wrongName.body.error.fields.confirmName).toBeDefined();

    const deleted = await ina.client.agent
      .delete(`/api/networks/${networkId}`)
      .set('X-CSRF-Token', await ina.client.csrf())
      .send({ confirmName: 'Short Lived Circle' });
    expect(deleted.status).toBe(200);
    expect(deleted.body).toEqual({ deletedPhotos: 1, deletedAccounts: 1 });

    const count = async (sql: string, params: unknown[]) =>
      Number((await t.dataSource.query(sql, params))[0].n);
    expect(await count('SELECT count(*) AS n FROM networks WHERE id = $1', [networkId])).toBe(0);
    expect(await count('SELECT count(*) AS n FROM trials WHERE network_id = $1', [networkId])).toBe(
      0,
    );
    expect(await count('SELECT count(*) AS n FROM sites WHERE id = $1', [siteId])).toBe(0);
    expect(await count('SELECT count(*) AS n FROM strips WHERE site_id = $1', [siteId])).toBe(0);
    expect(
      await count('SELECT count(*) AS n FROM rate_levels WHERE trial_id = $1', [trialId]),
    ).toBe(0);
    expect(await count('SELECT count(*) AS n FROM attachments WHERE site_id = $1', [siteId])).toBe(
      0,
    );
    expect(
      await count('SELECT count(*) AS n FROM memberships WHERE network_id = $1', [networkId]),
    ).toBe(0);
    expect(
      await count('SELECT count(*) AS n FROM invitations WHERE network_id = $1', [networkId]),
    ).toBe(0);
    expect(
      await count(
        `SELECT count(*) AS n FROM audit_events WHERE (entity_id IN ($1, $2, $3) OR site_id = $3) AND action <> 'deleted'`,
        [networkId, trialId, siteId],
      ),
    ).toBe(0);
    expect(fs.existsSync(path.join(folder, storedName))).toBe(false);
    // People who belong elsewhere keep their accounts; the one who belonged only here does not.
    expect(await count('SELECT count(*) AS n FROM users WHERE email = $1', [lonely])).toBe(0);
    expect((await signIn(t.app, helpers.emails.grower)).get).toBeDefined();
    expect((await ina.client.get('/api/auth/me')).body.memberships).toEqual([]);
  });
});

describe('invite-only instances', () => {
  let t: TestApp;
  let admin: Client;
  let grower: Client;

  beforeAll(async () => {
    t = await createTestApp({ SIGNUP: 'invite-only' });
    const net = await buildNetwork(t.dataSource, 'Invite only');
    admin = await signIn(t.app, net.emails.admin);
    grower = await signIn(t.app, net.emails.grower);
  });
  afterAll(() => t.close());

  it('says sign-up is closed and refuses it with 403', async () => {
    const client = clientFor(t.app);
    expect((await client.get('/api/auth/sign-up')).body).toEqual({ open: false });
    const res = await client.post('/api/auth/sign-up', {
      name: 'Walk In',
      email: `walk-in-${crypto.randomBytes(3).toString('hex')}@test.example`,
      password: 'long enough password',
      networkName: 'Walk-in Circle',
    });
    expect(res.status).toBe(403);
  });

  it('lets only an existing admin start another network', async () => {
    expect((await grower.post('/api/networks', { name: 'Grower’s own' })).status).toBe(403);
    expect((await admin.post('/api/networks', { name: 'Second circle' })).status).toBe(201);
  });
});
