import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn, type BuiltNetwork, type Client, type TestApp } from '../../helpers/app';
import {
  dataVersion,
  openCollectSite,
  publishSite,
  type CollectSite,
} from '../strips/collect-builders';

describe('site data: PATCH /api/sites/:siteId and GET /api/sites/:siteId/audit', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let site: CollectSite;
  let grower: Client;
  let coordinator: Client;

  beforeAll(async () => {
    ({ t, net, site, grower, coordinator } = await openCollectSite('Site data'));
  });
  afterAll(() => t.close());

  it('lets the grower set the site dates and notes, and bumps data_version', async () => {
    const before = await dataVersion(t.dataSource, site.siteId);
    const res = await grower.patch(`/api/sites/${site.siteId}`, {
      sowingDate: '2027-04-12',
      emergenceDate: '2027-04-25',
      notes: 'Dry spring',
    });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      sowingDate: '2027-04-12',
      emergenceDate: '2027-04-25',
      headingDate: null,
      notes: 'Dry spring',
    });
    expect(await dataVersion(t.dataSource, site.siteId)).toBe(before + 1);
    const again = await grower.patch(`/api/sites/${site.siteId}`, { sowingDate: '2027-04-12' });
    expect(again.status).toBe(200);
    expect(await dataVersion(t.dataSource, site.siteId)).toBe(before + 1);
  });

  it('rejects a date that is not YYYY-MM-DD', async () => {
    const res = await grower.patch(`/api/sites/${site.siteId}`, { headingDate: '12/06/2027' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('headingDate');
  });

  it('shows the coordinator who changed what, with old and new values', async () => {
    await grower.patch(`/api/strips/${site.strips[0]!.id}`, {
      version: 1,
      values: { moisturePct: 14.5 },
    });
    const res = await coordinator.get(`/api/sites/${site.siteId}/audit`);
    expect(res.status).toBe(200);
    const stripEvent = res.body.find((e: { entityType: string }) => e.entityType === 'strip');
    expect(stripEvent).toMatchObject({
      action: 'update',
      actorName: `grower ${net.suffix}`,
      actorEmail: net.emails.grower,
      entityId: site.strips[0]!.id,
      strip: { block: 1, position: 1, label: site.strips[0]!.label },
      before: { moisturePct: null },
      after: { moisturePct: 14.5 },
    });
    const siteEvent = res.body.find((e: { entityType: string }) => e.entityType === 'site');
    expect(siteEvent.after).toMatchObject({ sowingDate: '2027-04-12', notes: 'Dry spring' });
  });

  it('keeps the history from growers and members, and other growers from the dates', async () => {
    expect((await grower.get(`/api/sites/${site.siteId}/audit`)).status).toBe(403);
    const member = await signIn(t.app, net.emails.member);
    expect((await member.get(`/api/sites/${site.siteId}/audit`)).status).toBe(403);
    const grower2 = await signIn(t.app, net.emails.grower2);
    expect(
      (await grower2.patch(`/api/sites/${site.siteId}`, { harvestDate: '2027-08-01' })).status,
    ).toBe(403);
    expect(
      (await member.patch(`/api/sites/${site.siteId}`, { harvestDate: '2027-08-01' })).status,
    ).toBe(403);
  });

  it('answers 423 for date changes once the report is published', async () => {
    await publishSite(t.dataSource, site.otherSiteId);
    const grower2 = await signIn(t.app, net.emails.grower2);
    const res = await grower2.patch(`/api/sites/${site.otherSiteId}`, {
      harvestDate: '2027-08-01',
    });
    expect(res.status).toBe(423);
  });
});
