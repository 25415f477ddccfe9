import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  buildNetwork,
  createTestApp,
  signIn,
  type BuiltNetwork,
  type Client,
  type TestApp,
} from '../../helpers/app';

describe('people of a network', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let other: BuiltNetwork;
  let admin: Client;
  let coordinator: Client;

  /** Waits out the two-second membership cache so a role change is seen by the next request. */
  const waitForMembershipCache = () => new Promise((resolve) => setTimeout(resolve, 2100));

  beforeAll(async () => {
    t = await createTestApp();
    net = await buildNetwork(t.dataSource, 'People');
    other = await buildNetwork(t.dataSource, 'People other');
    admin = await signIn(t.app, net.emails.admin);
    coordinator = await signIn(t.app, net.emails.coordinator);
  });
  afterAll(() => t.close());

  it('lists members with their site counts and only the open invitations', async () => {
    const [trial] = await t.dataSource.query(
      `INSERT INTO trials (network_id, name, status, crop, season, reference_rate, reference_unit, blocks_per_site, rows_per_strip,
         row_spacing_in, strip_length_ft, border_rows, thousand_kernel_weight_g, germination_pct, emergence_pct, seed_price_per_lb, grain_price_per_bu)
       VALUES ($1, 'People trial', 'in-field', 'oats', '2027', 90, 'lb/acre', 2, 4, 8, 50, 1, 32, 90, 85, 0.5, 4) RETURNING id`,
      [net.networkId],
    );
    for (const field of ['North', 'South']) {
      await t.dataSource.query(
        `INSERT INTO sites (trial_id, grower_user_id, field_name) VALUES ($1, $2, $3)`,
        [trial.id, net.userIds.grower, field],
      );
    }
    const open = `open-${net.suffix}@test.example`;
    expect(
      (
        await coordinator.post(`/api/networks/${net.networkId}/invitations`, {
          email: open,
          role: 'grower',
        })
      ).status,
    ).toBe(201);
    await t.dataSource.query(
      `INSERT INTO invitations (network_id, email, role, token_hash, expires_at) VALUES ($1, $2, 'member', $3, now() - interval '1 day')`,
      [net.networkId, `expired-${net.suffix}@test.example`, `expired-${net.suffix}`],
    );
    await t.dataSource.query(
      `INSERT INTO invitations (network_id, email, role, token_hash, expires_at, accepted_at) VALUES ($1, $2, 'member', $3, now() + interval '1 day', now())`,
      [net.networkId, `accepted-${net.suffix}@test.example`, `accepted-${net.suffix}`],
    );

    const res = await coordinator.get(`/api/networks/${net.networkId}/people`);
    expect(res.status).toBe(200);
    expect(res.body.members).toHaveLength(5);
    expect(res.body.members).toContainEqual({
      userId: net.userIds.grower,
      name: `grower ${net.suffix}`,
      email: net.emails.grower,
      role: 'grower',
      siteCount: 2,
    });
    expect(res.body.members).toContainEqual(
      expect.objectContaining({ userId: net.userIds.admin, role: 'admin', siteCount: 0 }),
    );
    expect(res.body.invitations).toEqual([
      {
        id: expect.any(String),
        email: open,
        role: 'grower',
        expiresAt: expect.any(String),
        createdAt: expect.any(String),
      },
    ]);
  });

  it('lets a coordinator switch a person between grower and member, and records it in the audit log', async () => {
    const res = await coordinator.patch(
      `/api/networks/${net.networkId}/members/${net.userIds.grower2}`,
      { role: 'member' },
    );
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ userId: net.userIds.grower2, role: 'member' });
    const audit = await t.dataSource.query(
      `SELECT a.before, a.after, a.actor_user_id FROM audit_events a JOIN memberships m ON m.id = a.entity_id
        WHERE a.entity_type = 'membership' AND a.action = 'role_changed' AND m.user_id = $1`,
      [net.userIds.grower2],
    );
    expect(audit).toEqual([
      expect.objectContaining({
        actor_user_id: net.userIds.coordinator,
        before: expect.objectContaining({ role: 'grower' }),
        after: expect.objectContaining({ role: 'member' }),
      }),
    ]);
    expect(
      (
        await coordinator.patch(`/api/networks/${net.networkId}/members/${net.userIds.grower2}`, {
          role: 'grower',
        })
      ).body.role,
    ).toBe('grower');
  });

  it('returns 403 when a coordinator grants or removes the coordinator or admin role', async () => {
    expect(
      (
        await coordinator.patch(`/api/networks/${net.networkId}/members/${net.userIds.member}`, {
          role: 'coordinator',
        })
      ).status,
    ).toBe(403);
    expect(
      (
        await coordinator.patch(`/api/networks/${net.networkId}/members/${net.userIds.admin}`, {
          role: 'member',
        })
      ).status,
    ).toBe(403);
    expect(
      (
        await coordinator.patch(
          `/api/networks/${net.networkId}/members/${net.userIds.coordinator}`,
          { role: 'grower' },
        )
      ).status,
    ).toBe(403);
    const [row] = await t.dataSource.query('SELECT role FROM memberships WHERE user_id = $1', [
      net.userIds.member,
    ]);
    expect(row.role).toBe('member');
  });

  it('returns 400 naming the role field when the role is not one Sheaf knows', async () => {
    const res = await admin.patch(`/api/networks/${net.networkId}/members/${net.userIds.member}`, {
      role: 'farmer',
    });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['role']);
  });

  it('returns 404 for a person who is not in the network', async () => {
    expect(
      (
        await admin.patch(`/api/networks/${net.networkId}/members/${other.userIds.member}`, {
          role: 'grower',
        })
      ).status,
    ).toBe(404);
    expect(
      (await admin.patch(`/api/networks/${net.networkId}/members/not-a-uuid`, { role: 'grower' }))
        .status,
    ).toBe(404);
  });

  it('lets an admin make a coordinator, and refuses with 409 to remove the last admin', async () => {
    const net2 = await buildNetwork(t.dataSource, 'People admins');
    const admin2 = await signIn(t.app, net2.emails.admin);
    const promoted = await admin2.patch(
      `/api/networks/${net2.networkId}/members/${net2.userIds.member}`,
      { role: 'coordinator' },
    );
    expect(promoted.status).toBe(200);
    expect(promoted.body.role).toBe('coordinator');

    const lastAdmin = await admin2.patch(
      `/api/networks/${net2.networkId}/members/${net2.userIds.admin}`,
      { role: 'coordinator' },
    );
    expect(lastAdmin.status).toBe(409);
    expect(lastAdmin.body.error.code).toBe('conflict');

    // With a second admin the first may step down.
    expect(
      (
        await admin2.patch(`/api/networks/${net2.networkId}/members/${net2.userIds.coordinator}`, {
          role: 'admin',
        })
      ).status,
    ).toBe(200);
    expect(
      (
        await admin2.patch(`/api/networks/${net2.networkId}/members/${net2.userIds.admin}`, {
          role: 'coordinator',
        })
      ).status,
    ).toBe(200);
    const admins = await t.dataSource.query(
      `SELECT user_id FROM memberships WHERE network_id = $1 AND role = 'admin'`,
      [net2.networkId],
    );
    expect(admins).toEqual([{ user_id: net2.userIds.coordinator }]);

    // The former admin is now a coordinator (once the membership cache expires) and may not promote.
    await waitForMembershipCache();
    expect(
      (
        await admin2.patch(`/api/networks/${net2.networkId}/members/${net2.userIds.grower}`, {
          role: 'coordinator',
        })
      ).status,
    ).toBe(403);
  });

  it('revokes an open invitation so it leaves the list and its link stops working', async () => {
    const email = `revoke-${net.suffix}@test.example`;
    const created = await coordinator.post(`/api/networks/${net.networkId}/invitations`, {
      email,
      role: 'member',
    });
    expect(created.status).toBe(201);
    const mail = await t.mailCatcher.waitFor((m) => m.to.includes(email));
    const token = /invite\/([A-Za-z0-9_-]+)/.exec(mail.text)![1]!;

    const revoked = await coordinator.delete(
      `/api/networks/${net.networkId}/invitations/${created.body.id}`,
    );
    expect(revoked.status).toBe(204);
    const list = await coordinator.get(`/api/networks/${net.networkId}/people`);
    expect(list.body.invitations.map((i: { email: string }) => i.email)).not.toContain(email);
    expect((await coordinator.get(`/api/invitations/${token}`)).status).toBe(404);
    expect(
      (await coordinator.delete(`/api/networks/${net.networkId}/invitations/${created.body.id}`))
        .status,
    ).toBe(404);
    const [audit] = await t.dataSource.query(
      `SELECT action FROM audit_events WHERE entity_type = 'invitation' AND entity_id = $1`,
      [created.body.id],
    );
    expect(audit.action).toBe('revoked');
  });

  it('returns 404 when revoking another network’s invitation', async () => {
    const otherAdmin = await signIn(t.app, other.emails.admin);
    const created = await otherAdmin.post(`/api/networks/${other.networkId}/invitations`, {
      email: `elsewhere-${other.suffix}@test.example`,
      role: 'member',
    });
    expect(
      (await coordinator.delete(`/api/networks/${net.networkId}/invitations/${created.body.id}`))
        .status,
    ).toBe(404);
    const still = await otherAdmin.get(`/api/networks/${other.networkId}/people`);
    expect(still.body.invitations).toHaveLength(1);
  });

  it('answers 403 to members and growers and 404 to a coordinator of another network', async () => {
    const member = await signIn(t.app, net.emails.member);
    const grower = await signIn(t.app, net.emails.grower);
    const outsider = await signIn(t.app, other.emails.coordinator);
    for (const client of [member, grower]) {
      expect((await client.get(`/api/networks/${net.networkId}/people`)).status).toBe(403);
      expect(
        (
          await client.patch(`/api/networks/${net.networkId}/members/${net.userIds.member}`, {
            role: 'grower',
          })
        ).status,
      ).toBe(403);
    }
    expect((await outsider.get(`/api/networks/${net.networkId}/people`)).status).toBe(404);
    expect(
      (
        await outsider.patch(`/api/networks/${net.networkId}/members/${net.userIds.member}`, {
          role: 'grower',
        })
      ).status,
    ).toBe(404);
  });
});
