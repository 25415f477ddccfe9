// Several API processes serve one truth: against the two-worker test server, every change shows
// on the very next request, whichever worker answers it. Nothing waits for a cache to expire.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PooledReport, SiteReport } from '../../../shared/schemas/report';
import {
  buildNetwork,
  clientFor,
  createTestApp,
  signIn,
  type BuiltNetwork,
  type Client,
  type TestApp,
} from '../../helpers/app';
import {
  buildReportTrial,
  grainWeightFor,
  rcbdStrips,
  type BuiltTrial,
} from '../reports/build-report-trial';

let t: TestApp;
let net: BuiltNetwork;
let built: BuiltTrial;
const ROUNDS = 6;

beforeAll(async () => {
  t = await createTestApp();
  net = await buildNetwork(t.dataSource, 'Two workers');
  const strips = () =>
    rcbdStrips([
      [40, 52, 55, 56],
      [42, 54, 53, 55],
      [39, 51, 56, 54],
    ]);
  built = await buildReportTrial(t.dataSource, net, {
    sites: [
      { fieldName: 'North strip field', growerUserId: net.userIds.grower, strips: strips() },
      { fieldName: 'South strip field', growerUserId: net.userIds.grower2, strips: strips() },
      { fieldName: 'East strip field', growerUserId: null, strips: strips() },
    ],
  });
});
afterAll(() => t.close());

/** The worker processes that answered a run of requests. */
async function workersBehind(client: Client, url: string, requests = 12): Promise<Set<string>> {
  const pids = new Set<string>();
  for (let i = 0; i < requests; i += 1)
    pids.add(String((await client.get(url)).headers['x-sheaf-worker']));
  return pids;
}

describe('two API workers on one database', () => {
  it('spreads requests over both workers', async () => {
    const grower = await signIn(t.app, net.emails.grower);
    expect((await workersBehind(grower, '/api/auth/me')).size).toBe(2);
  });

  it('shows each strip change in the very next site and pooled report read', async () => {
    const grower = await signIn(t.app, net.emails.grower);
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const siteId = built.siteIds[0]!;
    const stripId = built.stripIds[0]![0]!;
    for (let round = 1; round <= ROUNDS; round += 1) {
      const strip = (await grower.get(`/api/strips/${stripId}`)).body as { version: number };
      const yieldWanted = 20 + round * 5;
      const { grainWeight } = grainWeightFor({ sites: [] }, yieldWanted);
      const saved = await grower.patch(`/api/strips/${stripId}`, {
        version: strip.version,
        values: { grainWeight },
      });
      expect(saved.status).toBe(200);
      const site = (await coordinator.get(`/api/sites/${siteId}/report`)).body as SiteReport;
      expect(site.strips.find((s) => s.id === stripId)?.yield).toBeCloseTo(yieldWanted, 6);
      const pooled = (await coordinator.get(`/api/trials/${built.trialId}/pooled-report`))
        .body as PooledReport;
      const mean = pooled.siteMeans.find(
        (m) => m.site === 'North strip field' && m.rate === '0.25',
      );
      // The quarter rate's other two blocks yielded 42 and 39.
      expect(mean?.mean).toBeCloseTo((yieldWanted + 42 + 39) / 3, 6);
    }
  });

  it('ends a session on sign-out for the very next request', async () => {
    for (let round = 0; round < ROUNDS; round += 1) {
      const client = await signIn(t.app, net.emails.member);
      expect((await client.get('/api/auth/me')).status).toBe(200);
      expect((await client.post('/api/auth/logout')).status).toBeLessThan(300);
      expect((await client.get('/api/auth/me')).status).toBe(401);
    }
  });

  it('ends every other session of the account on a password reset, at once', async () => {
    const email = net.emails.member;
    const elsewhere = await signIn(t.app, email);
    expect((await elsewhere.get('/api/auth/me')).status).toBe(200);
    const asking = clientFor(t.app);
    await asking.post('/api/auth/password-reset', { email });
    const mail = await t.mailCatcher.waitFor(
      (m) => m.to.includes(email) && /reset/i.test(m.subject),
    );
    const token = /\/reset\/([A-Za-z0-9_-]+)/.exec(mail.text)?.[1];
    expect(token).toBeTruthy();
    const done = await asking.post('/api/auth/password-reset/complete', {
      token,
      password: 'a-new-password-for-the-member',
    });
    expect(done.status).toBeLessThan(300);
    for (let i = 0; i < 4; i += 1) expect((await elsewhere.get('/api/auth/me')).status).toBe(401);
    // Put the demo password back for the other tests of this file.
    await t.dataSource.query(
      'UPDATE users SET password_hash = (SELECT password_hash FROM users WHERE id = $1) WHERE id = $2',
      [net.userIds.grower2, net.userIds.member],
    );
  });

  it('applies a role change to the very next request', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const grower = await signIn(t.app, net.emails.grower2);
    const stripId = built.stripIds[1]![0]!;
    const version = async () =>
      ((await grower.get(`/api/strips/${stripId}`)).body as { version: number }).version;
    const v = await version();
    expect(
      (await grower.patch(`/api/strips/${stripId}`, { version: v, values: { notes: 'mine' } }))
        .status,
    ).toBe(200);
    const demoted = await coordinator.patch(
      `/api/networks/${net.networkId}/members/${net.userIds.grower2}`,
      { role: 'member' },
    );
    expect(demoted.status).toBe(200);
    for (let i = 0; i < 4; i += 1) {
      const res = await grower.patch(`/api/strips/${stripId}`, {
        version: v + 1,
        values: { notes: `after demotion ${i}` },
      });
      expect(res.status).toBe(403);
    }
    await coordinator.patch(`/api/networks/${net.networkId}/members/${net.userIds.grower2}`, {
      role: 'grower',
    });
    expect((await grower.get(`/api/strips/${stripId}`)).status).toBe(200);
  });

  it('locks a site for edits on the very next request after publishing', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const grower = await signIn(t.app, net.emails.grower);
    const siteId = built.siteIds[0]!;
    const stripId = built.stripIds[0]![2]!;
    const published = await coordinator.post(`/api/sites/${siteId}/publish`);
    expect(published.status).toBe(200);
    const v = ((await grower.get(`/api/strips/${stripId}`)).body as { version: number }).version;
    for (let i = 0; i < 4; i += 1) {
      const res = await grower.patch(`/api/strips/${stripId}`, {
        version: v,
        values: { notes: `after publishing ${i}` },
      });
      expect(res.status).toBe(423);
    }
    expect((await coordinator.post(`/api/sites/${siteId}/unpublish`)).status).toBe(200);
    const open = await grower.patch(`/api/strips/${stripId}`, {
      version: v,
      values: { notes: 'open again' },
    });
    expect(open.status).toBe(200);
  });
});
