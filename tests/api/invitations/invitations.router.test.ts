import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  buildNetwork,
  clientFor,
  createTestApp,
  signIn,
  type BuiltNetwork,
  type TestApp,
} from '../../helpers/app';
import { buildActiveTrial } from '../trials/builders';

describe('invitations', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  beforeAll(async () => {
    t = await createTestApp();
    net = await buildNetwork(t.dataSource, 'Invitations');
  });
  afterAll(() => t.close());

  it('lets a coordinator invite a grower who then sets a name and password and is signed in', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const email = `new-grower-${net.suffix}@test.example`;
    const created = await coordinator.post(`/api/networks/${net.networkId}/invitations`, {
      email,
      role: 'grower',
    });
    expect(created.status).toBe(201);
    expect(created.body).not.toHaveProperty('token');

    const mail = await t.mailCatcher.waitFor((m) => m.to.includes(email));
    expect(mail.text).toMatch(/http:\/\/sheaf\.test\/invite\/[A-Za-z0-9_-]+/);
    expect(mail.html).toMatch(/href="http:\/\/sheaf\.test\/invite\//);
    const token = /invite\/([A-Za-z0-9_-]+)/.exec(mail.text)![1]!;

    const invitee = clientFor(t.app);
    const preview = await invitee.get(`/api/invitations/${token}`);
    expect(preview.status).toBe(200);
    const [{ name: networkName }] = await t.dataSource.query(
      'SELECT name FROM networks WHERE id = $1',
      [net.networkId],
    );
    expect(preview.body).toEqual({
      email,
      role: 'grower',
      networkName,
      expiresAt: expect.stringMatching(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/),
    });

    const accepted = await invitee.post('/api/invitations/accept', {
      token,
      name: 'Nell Furrow',
      password: 'long-enough-password',
    });
    expect(accepted.status).toBe(200);
    expect(accepted.body.memberships).toEqual([
      expect.objectContaining({ networkId: net.networkId, role: 'grower' }),
    ]);
    expect((await invitee.get('/api/auth/me')).body.name).toBe('Nell Furrow');

    const reused = await clientFor(t.app).post('/api/invitations/accept', {
      token,
      name: 'Someone',
      password: 'long-enough-password',
    });
    expect(reused.status).toBe(400);
  });

  it('refuses invitations from growers and members, and coordinator invitations from coordinators', async () => {
    const grower = await signIn(t.app, net.emails.grower);
    expect(
      (
        await grower.post(`/api/networks/${net.networkId}/invitations`, {
          email: `x-${net.suffix}@test.example`,
          role: 'member',
        })
      ).status,
    ).toBe(403);
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const res = await coordinator.post(`/api/networks/${net.networkId}/invitations`, {
      email: `y-${net.suffix}@test.example`,
      role: 'coordinator',
    });
    expect(res.status).toBe(403);
    const admin = await signIn(t.app, net.emails.admin);
    expect(
      (
        await admin.post(`/api/networks/${net.networkId}/invitations`, {
          email: `z-${net.suffix}@test.example`,
          role: 'coordinator',
        })
      ).status,
    ).toBe(201);
  });

  it('names the bad field when the invitation input is invalid', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const res = await coordinator.post(`/api/networks/${net.networkId}/invitations`, {
      email: 'nope',
      role: 'farmer',
    });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'role']);
  });

  it('answers 404 for an unknown invitation token', async () => {
    const res = await clientFor(t.app).get('/api/invitations/not-a-real-token-at-all');
    expect(res.status).toBe(404);
  });
  it('gives the new account the site it was enrolled for when the grower accepts', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const trialId = await buildActiveTrial(coordinator, net.networkId, { name: 'Enrol trial' });
    const email = `enrolled-${net.suffix}@test.example`;
    const enrolled = await coordinator.post(`/api/trials/${trialId}/sites`, {
      growerEmail: email,
      fieldName: 'River flat',
    });
    expect(enrolled.status).toBe(201);
    const mail = await t.mailCatcher.waitFor((m) => m.to.includes(email));
    const token = /invite\/([A-Za-z0-9_-]+)/.exec(mail.text)![1]!;
    const invitee = clientFor(t.app);
    const accepted = await invitee.post('/api/invitations/accept', {
      token,
      name: 'Ada Headland',
      password: 'long-enough-password',
    });
    expect(accepted.status).toBe(200);
    const mine = await invitee.get('/api/sites/mine');
    expect(mine.body).toEqual([
      expect.objectContaining({
        id: enrolled.body.id,
        fieldName: 'River flat',
        growerName: 'Ada Headland',
        growerEmail: email,
      }),
    ]);
  });
});

describe('invitation rate limit', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  beforeAll(async () => {
    // Its own setting, so other files' wrong passwords from this address cannot lock sign-in here.
    t = await createTestApp({ RATE_LIMIT_INVITES: '5' });
    net = await buildNetwork(t.dataSource, 'Invite limit');
  });
  afterAll(() => t.close());

  it('answers 429 once a coordinator sends too many invitations in an hour', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const statuses: number[] = [];
    for (let i = 0; i < 6; i += 1) {
      const res = await coordinator.post(`/api/networks/${net.networkId}/invitations`, {
        email: `bulk${i}-${net.suffix}@test.example`,
        role: 'member',
      });
      statuses.push(res.status);
    }
    expect(statuses).toEqual([201, 201, 201, 201, 201, 429]);
  });
});
