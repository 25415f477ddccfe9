// The first screen's lists: GET /api/trials (who reads which trial) and GET /api/sites/mine.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signIn, type BuiltNetwork, type Client, type TestApp } from '../../helpers/app';
import { openCollectSite, publishSite, type CollectSite } from '../strips/collect-builders';

describe('home: GET /api/trials and GET /api/sites/mine', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let site: CollectSite;
  let grower: Client;
  let coordinator: Client;
  let member: Client;
  let networkName: string;
  let laterTrialId: string;
  let undatedTrialId: string;

  /** A trial with no sites, in the built network, straight into the table (test fixture). */
  async function bareTrial(name: string, season: string | null): Promise<string> {
    const [row] = await t.dataSource.query(
      `INSERT INTO trials (network_id, name, status, crop, season) VALUES ($1, $2, 'draft', 'wheat', $3) RETURNING id`,
      [net.networkId, name, season],
    );
    return row.id;
  }

  beforeAll(async () => {
    ({ t, net, site, grower, coordinator } = await openCollectSite('Home'));
    member = await signIn(t.app, net.emails.member);
    [{ name: networkName }] = await t.dataSource.query('SELECT name FROM networks WHERE id = $1', [
      net.networkId,
    ]);
    laterTrialId = await bareTrial('Earlier season', '2026');
    undatedTrialId = await bareTrial('No season yet', null);
    // A yield on two strips of the grower's site.
    for (const strip of site.strips.slice(0, 2)) {
      const res = await grower.patch(`/api/strips/${strip.id}`, {
        version: 1,
        values: { grainWeight: 7, moisturePct: 13, harvestRows: 4, harvestLength: 50 },
      });
      expect(res.status).toBe(200);
    }
  });
  afterAll(() => t.close());

  it('lists every trial of the network to its coordinator, newest season first, with site counts', async () => {
    const res = await coordinator.get('/api/trials');
    expect(res.status).toBe(200);
    // Seasons sort newest first and a trial without a season comes last.
    expect(res.body).toEqual([
      {
        id: site.trialId,
        networkId: net.networkId,
        networkName,
        name: `Collect trial ${net.suffix}`,
        crop: 'oats',
        season: '2027',
        status: 'active',
        siteCount: 2,
      },
      {
        id: laterTrialId,
        networkId: net.networkId,
        networkName,
        name: 'Earlier season',
        crop: 'wheat',
        season: '2026',
        status: 'draft',
        siteCount: 0,
      },
      {
        id: undatedTrialId,
        networkId: net.networkId,
        networkName,
        name: 'No season yet',
        crop: 'wheat',
        season: null,
        status: 'draft',
        siteCount: 0,
      },
    ]);
  });

  it('shows a grower only the trials they grow a site in, and a member only published ones', async () => {
    const mine = await grower.get('/api/trials');
    expect(mine.status).toBe(200);
    expect(mine.body.map((r: { id: string }) => r.id)).toEqual([site.trialId]);
    expect((await member.get('/api/trials')).body).toEqual([]);
    await t.dataSource.query(
      `INSERT INTO report_snapshots (scope, trial_id, site_id, data_version, report) VALUES ('site', $1, $2, '1', '{}')`,
      [site.trialId, site.siteId],
    );
    const published = await member.get('/api/trials');
    expect(published.body.map((r: { id: string }) => r.id)).toEqual([site.trialId]);
    await t.dataSource.query(
      'UPDATE report_snapshots SET withdrawn_at = now() WHERE trial_id = $1',
      [site.trialId],
    );
    expect((await member.get('/api/trials')).body).toEqual([]);
  });

  it('lists the grower’s own sites with strip counts, yields in and the publish time', async () => {
    const res = await grower.get('/api/sites/mine');
    expect(res.status).toBe(200);
    // 2 blocks × 3 rates = 6 strips; a grain weight was entered on 2 of them.
    expect(res.body).toEqual([
      {
        id: site.siteId,
        trialId: site.trialId,
        trialName: `Collect trial ${net.suffix}`,
        crop: 'oats',
        season: '2027',
        fieldName: site.fieldName,
        growerName: `grower ${net.suffix}`,
        growerEmail: net.emails.grower,
        randomized: true,
        stripCount: 6,
        stripsWithYield: 2,
        publishedAt: null,
      },
    ]);
    await publishSite(t.dataSource, site.siteId);
    const after = await grower.get('/api/sites/mine');
    expect(after.body[0].publishedAt).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/);
    expect((await coordinator.get('/api/sites/mine')).body).toEqual([]);
  });
});
