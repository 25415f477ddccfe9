// Site rights follow the person's current role: a grower changed to member keeps their name on the
// site but can no longer change its strips, list them for editing or download its template.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Client } from '../../helpers/app';
import { openCollectSite, type CollectSite } from '../strips/collect-builders';
import type { BuiltNetwork, TestApp } from '../../helpers/app';

let t: TestApp;
let net: BuiltNetwork;
let site: CollectSite;
let grower: Client;
let coordinator: Client;
beforeAll(async () => {
  ({ t, net, site, grower, coordinator } = await openCollectSite('Demotion'));
});
afterAll(() => t.close());

const setRole = (role: string) =>
  coordinator.patch(`/api/networks/${net.networkId}/members/${net.userIds.grower}`, { role });

describe('a grower changed to member', () => {
  it('loses write access to their site at once, and gets it back when made grower again', async () => {
    const stripId = site.strips[0]!.id;
    const urls = [
      `/api/sites/${site.siteId}/strips`,
      `/api/sites/${site.siteId}/import-template.csv`,
    ];
    for (const url of urls) expect((await grower.get(url)).status, url).toBe(200);

    expect((await setRole('member')).status).toBe(200);
    for (const url of urls) expect((await grower.get(url)).status, url).toBe(403);
    const change = await grower.patch(`/api/strips/${stripId}`, {
      version: 1,
      values: { notes: 'as a member' },
    });
    expect(change.status).toBe(403);

    expect((await setRole('grower')).status).toBe(200);
    for (const url of urls) expect((await grower.get(url)).status, url).toBe(200);
  });

  it('records the role change in the audit trail', async () => {
    const rows = await t.dataSource.query(
      `SELECT a.before, a.after FROM audit_events a
         JOIN memberships m ON m.id = a.entity_id AND a.entity_type = 'membership'
        WHERE m.user_id = $1 AND m.network_id = $2 ORDER BY a.created_at`,
      [net.userIds.grower, net.networkId],
    );
    expect(rows.map((r: { after: { role: string } }) => r.after.role)).toEqual([
      'member',
      'grower',
    ]);
  });
});
