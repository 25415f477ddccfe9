import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn, type BuiltNetwork, type Client, type TestApp } from '../../helpers/app';
import { buildActiveTrial, enrol, openDesignNetwork } from '../trials/builders';

describe('removing a person and handing a site over', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let other: BuiltNetwork;
  let admin: Client;
  let coordinator: Client;
  let grower: Client;
  let grower2: Client;
  let outsider: Client;

  beforeAll(async () => {
    ({ t, net, other, admin, coordinator, grower, grower2, outsider } = await openDesignNetwork(
      'Removal',
      'Removal elsewhere',
    ));
  });
  afterAll(() => t.close());

  it('removes a grower: their site loses its grower, their session loses the network, the change is audited', async () => {
    const trialId = await buildActiveTrial(coordinator, net.networkId);
    const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower2 });
    expect((await grower2.get(`/api/sites/${siteId}`)).status).toBe(200);

    const res = await coordinator.delete(
      `/api/networks/${net.networkId}/members/${net.userIds.grower2}`,
    );
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ sitesLeftWithoutGrower: 1 });

    // The same signed-in session, on its next request: the network is gone from it.
    expect((await grower2.get(`/api/sites/${siteId}`)).status).toBe(404);
    expect((await grower2.get(`/api/trials/${trialId}`)).status).toBe(404);
    const me = await grower2.get('/api/auth/me');
    expect(me.body.memberships).toEqual([]);

    const site = await coordinator.get(`/api/trials/${trialId}`);
    expect(site.body.sites[0]).toMatchObject({ growerUserId: null, growerName: null });
    const people = await coordinator.get(`/api/networks/${net.networkId}/people`);
    expect(people.body.members.map((m: { userId: string }) => m.userId)).not.toContain(
      net.userIds.grower2,
    );
    const audit = await t.dataSource.query(
      `SELECT action, before FROM audit_events WHERE action IN ('removed', 'grower_removed') AND (before->>'userId' = $1 OR before->>'growerUserId' = $1)`,
      [net.userIds.grower2],
    );
    expect(audit.map((a: { action: string }) => a.action).sort()).toEqual([
      'grower_removed',
      'removed',
    ]);
  });

  it('hands a site without a grower to another grower, who can then open it', async () => {
    const trialId = await buildActiveTrial(coordinator, net.networkId);
    const siteId = await enrol(coordinator, trialId, {
      fieldName: 'Orphan field',
      growerUserId: net.userIds.grower,
    });
    // Arrange: the site's grower left the network earlier.
    await t.dataSource.query('UPDATE sites SET grower_user_id = NULL WHERE id = $1', [siteId]);
    expect((await grower.get(`/api/sites/${siteId}`)).status).toBe(403);
    const res = await coordinator.patch(`/api/sites/${siteId}`, {
      growerUserId: net.userIds.grower,
    });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ growerUserId: net.userIds.grower, namedInReports: false });
    expect((await grower.get(`/api/sites/${siteId}`)).status).toBe(200);
    const [event] = await t.dataSource.query(
      `SELECT after FROM audit_events WHERE site_id = $1 AND action = 'handed_over'`,
      [siteId],
    );
    expect(event.after).toEqual({ growerUserId: net.userIds.grower });
  });

  it('answers 400 naming growerUserId for a person of another network or a plain member', async () => {
    const trialId = await buildActiveTrial(coordinator, net.networkId);
    const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
    const foreign = await coordinator.patch(`/api/sites/${siteId}`, {
      growerUserId: other.userIds.grower,
    });
    expect(foreign.status).toBe(400);
    expect(foreign.body.error.fields.growerUserId).toMatch(/not a member/);
    const plain = await coordinator.patch(`/api/sites/${siteId}`, {
      growerUserId: net.userIds.member,
    });
    expect(plain.status).toBe(400);
    expect(plain.body.error.fields.growerUserId).toMatch(/member, not a grower/);
  });

  it('lets only the grower choose naming, and only coordinators hand over', async () => {
    const trialId = await buildActiveTrial(coordinator, net.networkId);
    const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
    expect(
      (await grower.patch(`/api/sites/${siteId}`, { growerUserId: net.userIds.grower })).status,
    ).toBe(403);
    expect((await coordinator.patch(`/api/sites/${siteId}`, { namedInReports: true })).status).toBe(
      403,
    );
    const named = await grower.patch(`/api/sites/${siteId}`, { namedInReports: true });
    expect(named.status).toBe(200);
    expect(named.body.namedInReports).toBe(true);
    expect((await outsider.patch(`/api/sites/${siteId}`, { lostReason: 'Flood' })).status).toBe(
      404,
    );
  });

  it('refuses a coordinator removing a coordinator (403) and the last admin (409)', async () => {
    const coordinatorId = net.userIds.coordinator;
    const byCoordinator = await coordinator.delete(
      `/api/networks/${net.networkId}/members/${coordinatorId}`,
    );
    expect(byCoordinator.status).toBe(403);
    const lastAdmin = await admin.delete(
      `/api/networks/${net.networkId}/members/${net.userIds.admin}`,
    );
    expect(lastAdmin.status).toBe(409);
    const unknown = await admin.delete(
      `/api/networks/${net.networkId}/members/${other.userIds.member}`,
    );
    expect(unknown.status).toBe(404);
  });

  it('keeps the person’s other networks when they leave one', async () => {
    // grower of the other network also joins this one as a member, then is removed here.
    await t.dataSource.query(
      `INSERT INTO memberships (user_id, network_id, role) VALUES ($1, $2, 'member')`,
      [other.userIds.grower, net.networkId],
    );
    const both = await signIn(t.app, other.emails.grower);
    expect((await both.get('/api/auth/me')).body.memberships).toHaveLength(2);
    expect(
      (await coordinator.delete(`/api/networks/${net.networkId}/members/${other.userIds.grower}`))
        .status,
    ).toBe(200);
    const me = await both.get('/api/auth/me');
    expect(me.body.memberships.map((m: { networkId: string }) => m.networkId)).toEqual([
      other.networkId,
    ]);
  });
});
