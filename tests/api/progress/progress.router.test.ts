import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn, type BuiltNetwork, type Client, type TestApp } from '../../helpers/app';
import { openCollectSite, type CollectSite } from '../strips/collect-builders';

describe('coordination: GET /api/trials/:trialId/progress and POST /api/trials/:trialId/reminders', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let site: CollectSite;
  let coordinator: Client;

  beforeAll(async () => {
    let grower: Client;
    ({ t, net, site, grower, coordinator } = await openCollectSite('Progress'));
    // Stand counts on every strip of the grower's site, a yield on one.
    for (const strip of site.strips) {
      const res = await grower.patch(`/api/strips/${strip.id}`, {
        version: 1,
        values: { standCounts: [30, 31], standRowLength: 3 },
      });
      expect(res.status).toBe(200);
    }
    await grower.patch(`/api/strips/${site.strips[0]!.id}`, {
      version: 2,
      values: { grainWeight: 7, moisturePct: 13, harvestRows: 4, harvestLength: 50 },
    });
  });
  afterAll(() => t.close());

  it('shows per site how many strips have each measurement in', async () => {
    const res = await coordinator.get(`/api/trials/${site.trialId}/progress`);
    expect(res.status).toBe(200);
    const own = res.body.sites.find((s: { siteId: string }) => s.siteId === site.siteId);
    expect(own).toMatchObject({
      stripCount: 6,
      recorded: { stand: 6, tillers: 0, heads: 0, yield: 1 },
    });
    expect(own.lastChangeAt).not.toBeNull();
    const other = res.body.sites.find((s: { siteId: string }) => s.siteId === site.otherSiteId);
    expect(other.recorded).toEqual({ stand: 0, tillers: 0, heads: 0, yield: 0 });
  });

  it('e-mails growers with missing counts, with text and HTML parts and a link to their site', async () => {
    const res = await coordinator.post(`/api/trials/${site.trialId}/reminders`, {
      groups: ['stand', 'yield'],
    });
    expect(res.status).toBe(200);
    expect(res.body.sent.map((s: { to: string }) => s.to).sort()).toEqual(
      [net.emails.grower, net.emails.grower2].sort(),
    );
    const mail = await t.mailCatcher.waitFor(
      (m) => m.to.includes(net.emails.grower) && /missing/.test(m.subject),
    );
    expect(mail.text).toContain('Grain weight and moisture: 5 of 6 strips still to enter.');
    expect(mail.text).not.toContain('Stand count:');
    expect(mail.text).toContain(`http://sheaf.test/sites/${site.siteId}`);
    expect(mail.html).toContain(`href="http://sheaf.test/sites/${site.siteId}"`);
  });

  it('skips sites with nothing missing', async () => {
    const res = await coordinator.post(`/api/trials/${site.trialId}/reminders`, {
      groups: ['stand'],
      siteIds: [site.siteId],
    });
    expect(res.body).toEqual({
      sent: [],
      skipped: [{ siteId: site.siteId, reason: 'Nothing is missing' }],
    });
  });

  it('is for coordinators only', async () => {
    const grower = await signIn(t.app, net.emails.grower);
    expect((await grower.get(`/api/trials/${site.trialId}/progress`)).status).toBe(403);
    expect((await grower.post(`/api/trials/${site.trialId}/reminders`, {})).status).toBe(403);
    const member = await signIn(t.app, net.emails.member);
    expect((await member.get(`/api/trials/${site.trialId}/progress`)).status).toBe(403);
  });
});
