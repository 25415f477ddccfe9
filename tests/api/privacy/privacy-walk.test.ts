// Walks every GET route in the router table as a member, as another grower of the same network
// and as a grower of another network, and searches each body for what growers keep private:
// e-mail addresses, fertility and site notes, and the names of farms that chose not to be named.
import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RouteEntry } from '../../../api/lib/route-table';
import {
  buildNetwork,
  createTestApp,
  signIn,
  type BuiltNetwork,
  type Client,
  type TestApp,
} from '../../helpers/app';
import { buildReportTrial, rcbdStrips, type BuiltTrial } from '../reports/build-report-trial';

const SECRET_FERTILITY = 'FERTILITY-SECRET-40-lb-N';
const SECRET_NOTES = 'SITE-NOTE-SECRET-wet-corner';
const SECRET_STRIP_NOTE = 'STRIP-NOTE-SECRET-deer';
const HIDDEN_FIELD = 'Hidden Hollow';
const ORPHAN_FIELD = 'Quiet Corner';
const NAMED_FIELD = 'Open Acre';

describe('growers’ privacy across every route', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let other: BuiltNetwork;
  let trial: BuiltTrial;
  let coordinator: Client;
  let member: Client;
  let grower: Client;
  let grower2: Client;
  let foreignGrower: Client;
  let routes: RouteEntry[];
  let publicToken = '';

  beforeAll(async () => {
    t = await createTestApp();
    net = await buildNetwork(t.dataSource, 'Privacy');
    other = await buildNetwork(t.dataSource, 'Privacy other');
    const yields = [
      [40, 52, 58, 60],
      [42, 50, 57, 61],
      [39, 53, 59, 58],
      [41, 51, 60, 62],
    ];
    trial = await buildReportTrial(t.dataSource, net, {
      sites: [
        { fieldName: HIDDEN_FIELD, growerUserId: net.userIds.grower, strips: rcbdStrips(yields) },
        {
          fieldName: NAMED_FIELD,
          growerUserId: net.userIds.grower2,
          strips: rcbdStrips(yields.map((row) => row.map((y, i) => y + 3 * i))),
        },
        {
          fieldName: ORPHAN_FIELD,
          growerUserId: null,
          strips: rcbdStrips(yields.map((row) => row.map((y, i) => y - 2 * i + 5))),
        },
      ],
    });
    await t.dataSource.query(
      `UPDATE sites SET fertility = $2, notes = $3, named_in_reports = (field_name = $4) WHERE trial_id = $1`,
      [trial.trialId, SECRET_FERTILITY, SECRET_NOTES, NAMED_FIELD],
    );
    await t.dataSource.query(
      `UPDATE observations SET notes = $2 WHERE strip_id IN (SELECT st.id FROM strips st JOIN sites s ON s.id = st.site_id WHERE s.trial_id = $1)`,
      [trial.trialId, SECRET_STRIP_NOTE],
    );
    await t.dataSource.query(
      `INSERT INTO attachments (site_id, strip_id, stored_name, original_name, mime_type, size_bytes, uploaded_by)
       VALUES ($1, $2, $3, 'x.png', 'image/png', 1, $4)`,
      [
        trial.siteIds[0],
        trial.stripIds[0]![0],
        `privacy-${crypto.randomUUID()}.png`,
        net.userIds.grower,
      ],
    );
    coordinator = await signIn(t.app, net.emails.coordinator);
    for (const siteId of trial.siteIds) {
      const r = await coordinator.post(`/api/sites/${siteId}/publish`);
      expect(r.status, JSON.stringify(r.body)).toBe(200);
    }
    const pooled = await coordinator.post(`/api/trials/${trial.trialId}/publish`);
    expect(pooled.status, JSON.stringify(pooled.body)).toBe(200);
    const link = await coordinator.post(`/api/trials/${trial.trialId}/public-link`, {
      enabled: true,
    });
    publicToken = link.body.token;
    member = await signIn(t.app, net.emails.member);
    grower = await signIn(t.app, net.emails.grower);
    grower2 = await signIn(t.app, net.emails.grower2);
    foreignGrower = await signIn(t.app, other.emails.grower);
    routes = (await t.routes()).filter(
      (r) => r.method === 'get' && !r.path.endsWith('.pdf') && r.path !== '/api/admin/mail',
    );
  });
  afterAll(() => t.close());

  function concrete(path: string): string {
    return path.replace(/:([A-Za-z]+)/g, (_m, name: string) => {
      switch (name) {
        case 'networkId':
          return net.networkId;
        case 'trialId':
          return trial.trialId;
        case 'siteId':
          return trial.siteIds[0]!;
        case 'stripId':
          return trial.stripIds[0]![0]!;
        case 'userId':
          return net.userIds.grower;
        case 'token':
          return publicToken;
        default:
          return '00000000-0000-4000-8000-000000000000';
      }
    });
  }

  /** Every private value found in the bodies of every GET route, for one reader. */
  async function leaks(client: Client, allowed: string[] = []): Promise<string[]> {
    const secrets = [
      ...Object.values(net.emails),
      SECRET_FERTILITY,
      SECRET_NOTES,
      SECRET_STRIP_NOTE,
      HIDDEN_FIELD,
      ORPHAN_FIELD,
    ].filter((s) => !allowed.includes(s));
    const found: string[] = [];
    for (const route of routes) {
      const url = concrete(route.path);
      const res = await client.get(url);
      const body = res.text ?? JSON.stringify(res.body);
      for (const secret of secrets)
        if (body.toLowerCase().includes(secret.toLowerCase()))
          found.push(`${route.path} (${res.status}) shows ${secret}`);
    }
    return found;
  }

  it('shows a member no e-mail, fertility, notes or unnamed farm', async () => {
    expect(await leaks(member, [net.emails.member])).toEqual([]);
  });

  it('shows another grower of the network nothing private of other farms', async () => {
    expect(await leaks(grower2, [net.emails.grower2])).toEqual([]);
  });

  it('shows a grower of another network nothing at all', async () => {
    expect(await leaks(foreignGrower)).toEqual([]);
  });

  it('shows the same private values to the coordinator (the search can find them)', async () => {
    const found = await leaks(coordinator);
    expect(found.some((f) => f.includes(SECRET_FERTILITY))).toBe(true);
    expect(found.some((f) => f.includes(HIDDEN_FIELD))).toBe(true);
    expect(found.some((f) => f.includes(net.emails.grower))).toBe(true);
  });

  it('labels unnamed farms the same way in every report of the trial', async () => {
    const pooled = await member.get(`/api/trials/${trial.trialId}/pooled-report`);
    expect(pooled.status).toBe(200);
    const names = pooled.body.sitesIncluded.map((s: { fieldName: string }) => s.fieldName);
    // Enrolment order: Hidden Hollow is the first site, Quiet Corner the third.
    expect(names).toEqual(['Farm A', NAMED_FIELD, 'Farm C']);
    const site = await member.get(`/api/sites/${trial.siteIds[2]}/report`);
    expect(site.body.site.fieldName).toBe('Farm C');
    const trialPage = await member.get(`/api/trials/${trial.trialId}`);
    expect(trialPage.body.sites.map((s: { fieldName: string }) => s.fieldName)).toEqual([
      'Farm A',
      NAMED_FIELD,
      'Farm C',
    ]);
    const publicReport = await member.get(`/api/public/reports/${publicToken}`);
    expect(publicReport.body.sitesIncluded.map((s: { fieldName: string }) => s.fieldName)).toEqual([
      'Farm A',
      NAMED_FIELD,
      'Farm C',
    ]);
  });

  it('shows a grower their own farm by name and everything of it', async () => {
    const own = await grower.get(`/api/sites/${trial.siteIds[0]}/report`);
    expect(own.body.site.fieldName).toBe(HIDDEN_FIELD);
    expect(own.body.site.fertility).toBe(SECRET_FERTILITY);
    const pooled = await grower.get(`/api/trials/${trial.trialId}/pooled-report`);
    expect(pooled.body.sitesIncluded.map((s: { fieldName: string }) => s.fieldName)).toEqual([
      HIDDEN_FIELD,
      NAMED_FIELD,
      'Farm C',
    ]);
  });
});
