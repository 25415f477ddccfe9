import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { describeEvent, plotNumber } from '../../../api/audit/plain-words';
import type { BuiltNetwork, Client, TestApp } from '../../helpers/app';
import { buildActiveTrial, enrol, openDesignNetwork } from '../trials/builders';

describe('plain-words history', () => {
  it('names the plot as on the field sheet and gives units', () => {
    // Common practice, no published source: plot = block × 100 + position on field sheets.
    expect(plotNumber({ block: 2, position: 3 })).toBe(203);
    const sentence = describeEvent(
      {
        action: 'update',
        entityType: 'strip',
        who: 'Ina Bell',
        before: { grainWeight: 4.1 },
        after: { grainWeight: 4.2 },
        strip: { block: 2, position: 3 },
      },
      { unitSystem: 'imperial', names: new Map() },
    );
    expect(sentence).toBe(
      'Ina Bell changed the threshed grain weight of plot 203 from 4.1 to 4.2 lb',
    );
    const metric = describeEvent(
      {
        action: 'update',
        entityType: 'site',
        who: 'Ina Bell',
        before: { sowingDate: null },
        after: { sowingDate: '2027-04-20' },
        strip: null,
      },
      { unitSystem: 'metric', names: new Map() },
    );
    expect(metric).toBe('Ina Bell recorded the sowing date of the site: 20 Apr 2027');
  });
});

describe('GET /api/sites/:siteId/history', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let coordinator: Client;
  let grower: Client;
  let grower2: Client;
  let member: Client;

  beforeAll(async () => {
    ({ t, net, coordinator, grower, grower2, member } = await openDesignNetwork(
      'History',
      'History elsewhere',
    ));
  });
  afterAll(() => t.close());

  it('tells the grower and coordinator what happened, with names and plot numbers, no ids', async () => {
    const trialId = await buildActiveTrial(coordinator, net.networkId);
    const siteId = await enrol(coordinator, trialId, { growerUserId: net.userIds.grower });
    await coordinator.post(`/api/sites/${siteId}/randomize`, {});
    const [strip] = await t.dataSource.query(
      'SELECT id, block, position FROM strips WHERE site_id = $1 AND block = 2 AND position = 3',
      [siteId],
    );
    const first = await grower.patch(`/api/strips/${strip.id}`, {
      version: 1,
      values: { grainWeight: 4.1 },
    });
    expect(first.status).toBe(200);
    await grower.patch(`/api/strips/${strip.id}`, {
      version: first.body.version,
      values: { grainWeight: 4.2 },
    });
    const res = await grower.get(`/api/sites/${siteId}/history`);
    expect(res.status).toBe(200);
    const sentences = res.body.map((e: { sentence: string }) => e.sentence);
    expect(sentences[0]).toBe(
      `grower ${net.suffix} changed the threshed grain weight of plot 203 from 4.1 to 4.2 lb`,
    );
    expect(sentences).toContain(`coordinator ${net.suffix} drew the strip map`);
    expect(JSON.stringify(sentences)).not.toMatch(/[0-9a-f]{8}-[0-9a-f]{4}-/);
    expect((await coordinator.get(`/api/sites/${siteId}/history`)).status).toBe(200);
    expect((await grower2.get(`/api/sites/${siteId}/history`)).status).toBe(403);
    expect((await member.get(`/api/sites/${siteId}/history`)).status).toBe(403);
  });
});
