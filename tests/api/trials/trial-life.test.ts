import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { rateTable } from '../../../shared/design/rate-table';
import type { BuiltNetwork, Client, TestApp } from '../../helpers/app';
import { buildActiveTrial, completeDesign, enrol, openDesignNetwork } from './builders';

describe('a trial’s life and its design lock', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let coordinator: Client;
  let grower: Client;
  let member: Client;
  let outsider: Client;

  beforeAll(async () => {
    ({ t, net, coordinator, grower, member, outsider } = await openDesignNetwork(
      'Trial life',
      'Trial life elsewhere',
    ));
  });
  afterAll(() => t.close());

  /** An in-field trial with randomized sites for the grower and grower2. */
  async function trialWithSites(): Promise<{ trialId: string; siteIds: string[] }> {
    const trialId = await buildActiveTrial(coordinator, net.networkId);
    const siteIds: string[] = [];
    for (const [i, growerUserId] of [net.userIds.grower, net.userIds.grower2].entries()) {
      const siteId = await enrol(coordinator, trialId, { growerUserId, fieldName: `Field ${i}` });
      expect((await coordinator.post(`/api/sites/${siteId}/randomize`, {})).status).toBe(200);
      siteIds.push(siteId);
    }
    return { trialId, siteIds };
  }

  async function recordYield(siteId: string) {
    await t.dataSource.query(
      `INSERT INTO observations (strip_id, grain_weight, harvest_area)
       SELECT id, 1500, 100 FROM strips WHERE site_id = $1 ORDER BY block, position LIMIT 1`,
      [siteId],
    );
  }

  it('walks draft → in-field → harvest-in → closed and reopens', async () => {
    const created = await coordinator.post('/api/trials', {
      networkId: net.networkId,
      ...completeDesign(),
    });
    expect(created.body.status).toBe('draft');
    const trialId = created.body.id as string;
    const sent = await coordinator.patch(`/api/trials/${trialId}`, { status: 'in-field' });
    expect(sent.body.status).toBe('in-field');
    const a = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
    const b = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower2 });
    for (const id of [a, b]) await coordinator.post(`/api/sites/${id}/randomize`, {});

    const early = await coordinator.patch(`/api/trials/${trialId}`, { status: 'closed' });
    expect(early.status).toBe(409);
    expect(early.body.error.message).toMatch(/2 of 2 sites/);

    await recordYield(a);
    const lost = await coordinator.patch(`/api/sites/${b}`, { lostReason: 'Hail on 3 July' });
    expect(lost.status).toBe(200);
    const harvested = await coordinator.get(`/api/trials/${trialId}`);
    expect(harvested.body.status).toBe('harvest-in');
    expect(harvested.body.harvest).toEqual({ sites: 2, withYield: 1, lost: 1 });

    const closed = await coordinator.patch(`/api/trials/${trialId}`, { status: 'closed' });
    expect(closed.status).toBe(200);
    expect(closed.body.status).toBe('closed');
    expect(closed.body.closedAt).not.toBeNull();
    expect(closed.body.canEdit).toBe(false);

    const edit = await coordinator.patch(`/api/trials/${trialId}`, { name: 'Renamed' });
    expect(edit.status).toBe(423);
    const enrolClosed = await coordinator.post(`/api/trials/${trialId}/sites`, {
      fieldName: 'Late',
      growerUserId: net.userIds.grower,
    });
    expect(enrolClosed.status).toBe(409);

    const reopened = await coordinator.patch(`/api/trials/${trialId}`, { status: 'in-field' });
    expect(reopened.status).toBe(200);
    expect(reopened.body.status).toBe('harvest-in');

    const history = await t.dataSource.query(
      `SELECT action, after FROM audit_events WHERE entity_id = $1 AND action = 'status_changed' ORDER BY created_at`,
      [trialId],
    );
    expect(history.map((h: { after: { status: string } }) => h.after.status)).toEqual([
      'in-field',
      'closed',
      'in-field',
    ]);
  });

  it('refuses to set harvest-in by hand', async () => {
    const { trialId } = await trialWithSites();
    const res = await coordinator.patch(`/api/trials/${trialId}`, { status: 'harvest-in' });
    expect(res.status).toBe(409);
  });

  it('deletes a draft with 204 and refuses a trial in the field with 409', async () => {
    const draft = await coordinator.post('/api/trials', {
      networkId: net.networkId,
      name: 'Throw away',
    });
    expect((await grower.delete(`/api/trials/${draft.body.id}`)).status).toBe(403);
    expect((await outsider.delete(`/api/trials/${draft.body.id}`)).status).toBe(404);
    expect((await coordinator.delete(`/api/trials/${draft.body.id}`)).status).toBe(204);
    expect((await coordinator.get(`/api/trials/${draft.body.id}`)).status).toBe(404);
    const [{ n }] = await t.dataSource.query(
      'SELECT count(*)::int AS n FROM rate_levels WHERE trial_id = $1',
      [draft.body.id],
    );
    expect(n).toBe(0);

    const active = await buildActiveTrial(coordinator, net.networkId);
    const refused = await coordinator.delete(`/api/trials/${active}`);
    expect(refused.status).toBe(409);
  });

  it('lets seed-weight fields change freely before sowing', async () => {
    const { trialId } = await trialWithSites();
    const res = await coordinator.patch(`/api/trials/${trialId}`, { referenceRate: 110 });
    expect(res.status).toBe(200);
    expect(res.body.sowingStarted).toBe(false);
    expect(res.body.lockedFields).toEqual([]);
  });

  it('answers 409 design_locked once a site is sown, and amends with a reason', async () => {
    const { trialId, siteIds } = await trialWithSites();
    await t.dataSource.query(`UPDATE sites SET sowing_date = '2027-04-20' WHERE id = $1`, [
      siteIds[0],
    ]);
    const layoutBefore = await grower.get(`/api/sites/${siteIds[0]}/layout`);
    const locked = await coordinator.patch(`/api/trials/${trialId}`, {
      referenceRate: 120,
      germinationPct: 90,
    });
    expect(locked.status).toBe(409);
    expect(locked.body.error.code).toBe('design_locked');
    expect(Object.keys(locked.body.error.fields)).toEqual(['referenceRate', 'germinationPct']);
    // Fields that do not change seed weights stay open.
    expect(
      (await coordinator.patch(`/api/trials/${trialId}`, { question: 'Still open?' })).status,
    ).toBe(200);
    expect((await coordinator.get(`/api/trials/${trialId}`)).body.lockedFields).toContain(
      'referenceRate',
    );

    const amended = await coordinator.patch(`/api/trials/${trialId}`, {
      referenceRate: 120,
      amendReason: 'The seed lot ran out; the new lot is bolder seed',
    });
    expect(amended.status).toBe(200);
    expect(amended.body.referenceRate).toBe(120);
    expect(amended.body.sites.every((s: { packetReissuedAt: string }) => s.packetReissuedAt)).toBe(
      true,
    );

    // The packet's seed weights follow the amended rate: 120/96 of before.
    const layoutAfter = await grower.get(`/api/sites/${siteIds[0]}/layout`);
    const before = layoutBefore.body.blocks[0].strips[0];
    const after = layoutAfter.body.blocks[0].strips.find(
      (s: { rateLevelId: string }) => s.rateLevelId === before.rateLevelId,
    );
    // Common practice, no published source: seed per strip is proportional to the rate.
    expect(after.seedGrams).toBeCloseTo((before.seedGrams * 120) / 96, 0);
    const expected = rateTable({ ...completeDesign(), referenceRate: 120 }).find(
      (r) => r.multiplier === before.rate,
    )!;
    expect(after.seedGrams).toBeCloseTo(expected.gramsPerStrip, 0);

    const amendments = await member.get(`/api/trials/${trialId}/amendments`);
    expect(amendments.status).toBe(403); // nothing published: members cannot read the trial
    const list = await grower.get(`/api/trials/${trialId}/amendments`);
    expect(list.status).toBe(200);
    expect(list.body).toHaveLength(1);
    expect(list.body[0]).toMatchObject({
      reason: 'The seed lot ran out; the new lot is bolder seed',
      changes: [{ field: 'referenceRate', from: 96, to: 120 }],
      reissuedSites: 2,
      byName: `coordinator ${net.suffix}`,
    });

    const mail = await t.mailCatcher.waitFor((m) => m.to.includes(net.emails.grower));
    expect(mail.subject).toMatch(/design .* changed/);
    expect(mail.text).toMatch(/bolder seed/);
    await t.mailCatcher.waitFor((m) => m.to.includes(net.emails.grower2));
  });

  it('answers 400 naming amendReason when the reason is too short', async () => {
    const { trialId, siteIds } = await trialWithSites();
    await t.dataSource.query(`UPDATE sites SET sowing_date = '2027-04-20' WHERE id = $1`, [
      siteIds[1],
    ]);
    const res = await coordinator.patch(`/api/trials/${trialId}`, {
      stripLengthFt: 80,
      amendReason: 'x',
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.amendReason).toBeDefined();
  });
});
