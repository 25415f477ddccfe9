// A closed trial is read-only: strip changes get 423 and the strip list says it cannot be edited,
// until the coordinator reopens the trial.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BuiltNetwork, Client, TestApp } from '../../helpers/app';
import { openCollectSite, type CollectSite } from './collect-builders';

let t: TestApp;
let site: CollectSite;
let grower: Client;
beforeAll(async () => {
  let _net: BuiltNetwork;
  ({ t, net: _net, site, grower } = await openCollectSite('Closed trial'));
});
afterAll(() => t.close());

const setStatus = (status: string) =>
  t.dataSource.query(
    'UPDATE trials SET status = $2 WHERE id = (SELECT trial_id FROM sites WHERE id = $1)',
    [site.siteId, status],
  );

describe('strip data of a closed trial', () => {
  it('refuses changes with 423 while the trial is closed and accepts them once reopened', async () => {
    const stripId = site.strips[0]!.id;
    await setStatus('closed');
    const refused = await grower.patch(`/api/strips/${stripId}`, {
      version: 1,
      values: { notes: 'after closing' },
    });
    expect(refused.status).toBe(423);
    expect(refused.body.error.message).toMatch(/closed/);
    const list = await grower.get(`/api/sites/${site.siteId}/strips`);
    expect(list.body.site.canEdit).toBe(false);

    await setStatus('in-field');
    const saved = await grower.patch(`/api/strips/${stripId}`, {
      version: 1,
      values: { notes: 'reopened' },
    });
    expect(saved.status).toBe(200);
  });
});
