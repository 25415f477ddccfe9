// Smaller leaks: growers (and members) never receive a trial's public link token, and enrolling
// a site by e-mail answers the same for an account in another network as for an unknown address.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  buildActiveTrial,
  enrol,
  openDesignNetwork,
  type DesignTestNetwork,
} from '../trials/builders';

describe('what coordinators and members can learn', () => {
  let n: DesignTestNetwork;
  beforeAll(async () => {
    n = await openDesignNetwork('Privacy', 'Privacy other');
  });
  afterAll(() => n.t.close());

  it('gives the public link token to coordinators only', async () => {
    const trialId = await buildActiveTrial(n.coordinator, n.net.networkId);
    await n.t.dataSource.query('UPDATE trials SET public_link_token = $1 WHERE id = $2', [
      `link-${n.net.suffix}`,
      trialId,
    ]);
    const seen = async (client: typeof n.member) =>
      (await client.get(`/api/trials/${trialId}`)).body;
    expect((await seen(n.coordinator)).publicLinkToken).toBe(`link-${n.net.suffix}`);
    // The grower reads the trial through their site; members only once reports are published.
    await enrol(n.coordinator, trialId, { growerUserId: n.net.userIds.grower });
    for (const reader of [n.grower]) {
      const body = await seen(reader);
      expect(body.id).toBe(trialId);
      expect(body.publicLinkToken).toBeNull();
      expect(JSON.stringify(body)).not.toContain(`link-${n.net.suffix}`);
    }
  });

  it('answers alike for an address with an account in another network and an unknown one', async () => {
    const trialId = await buildActiveTrial(n.coordinator, n.net.networkId, {
      name: 'Privacy trial',
    });
    const enrol = (growerEmail: string, fieldName: string) =>
      n.coordinator.post(`/api/trials/${trialId}/sites`, { growerEmail, fieldName });
    const elsewhere = await enrol(n.other.emails.grower, 'Field A');
    const unknown = await enrol(`nobody-${n.net.suffix}@test.example`, 'Field B');
    expect(elsewhere.status).toBe(unknown.status);
    expect(elsewhere.status).toBe(201);
    expect(elsewhere.body.grower).toMatchObject({ userId: null, invitationPending: true });
    expect(Object.keys(elsewhere.body.grower).sort()).toEqual(
      Object.keys(unknown.body.grower).sort(),
    );
    expect(elsewhere.body.grower.name ?? null).toBe(unknown.body.grower.name ?? null);
  });
});
