// Report reads never hide a write: a strip change and a write from another process show on the
// very next read, and the ETag lets a repeat read cost a 304. Runs against the real PostgreSQL.
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SiteReport } from '../../../shared/schemas/report';
import {
  buildNetwork,
  createTestApp,
  signIn,
  testDatabaseUrl,
  type BuiltNetwork,
  type TestApp,
} from '../../helpers/app';
import {
  buildReportTrial,
  grainWeightFor,
  rcbdStrips,
  type BuiltTrial,
} from './build-report-trial';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

describe('report reads follow the data', () => {
  let net: BuiltNetwork;
  let built: BuiltTrial;
  beforeAll(async () => {
    net = await buildNetwork(t.dataSource, 'Fresh reads');
    built = await buildReportTrial(t.dataSource, net, {
      sites: [
        {
          fieldName: 'Cache field',
          growerUserId: net.userIds.grower,
          soil: 'loam',
          strips: rcbdStrips([
            [40, 52, 55, 56],
            [42, 54, 53, 55],
            [39, 51, 56, 54],
          ]),
        },
      ],
    });
  });

  const quarterMean = (report: SiteReport) =>
    report.analysis!.means.find((m) => m.rate === '0.25')!.mean;

  it('shows a strip change made through the API on the very next read', async () => {
    const grower = await signIn(t.app, net.emails.grower);
    const siteId = built.siteIds[0]!;
    const first = (await grower.get(`/api/sites/${siteId}/report`)).body as SiteReport;
    const again = (await grower.get(`/api/sites/${siteId}/report`)).body as SiteReport;
    expect(quarterMean(again)).toBe(quarterMean(first));

    const stripId = built.stripIds[0]![0]!;
    const strip = (await grower.get(`/api/strips/${stripId}`)).body as { version: number };
    const { grainWeight } = grainWeightFor({ sites: [] }, 10);
    const patched = await grower.patch(`/api/strips/${stripId}`, {
      version: strip.version,
      values: { grainWeight },
    });
    expect(patched.status).toBe(200);

    const after = (await grower.get(`/api/sites/${siteId}/report`)).body as SiteReport;
    expect(quarterMean(after)).toBeLessThan(quarterMean(first) - 5);
  });

  it('shows a write from another process on the very next read', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const siteId = built.siteIds[0]!;
    const before = (await coordinator.get(`/api/sites/${siteId}/report`)).body as SiteReport;
    // A separate connection outside TypeORM stands in for psql or a restore.
    const other = new pg.Client({ connectionString: testDatabaseUrl() });
    await other.connect();
    try {
      await other.query(`UPDATE sites SET field_name = 'Renamed elsewhere' WHERE id = $1`, [
        siteId,
      ]);
    } finally {
      await other.end();
    }
    expect(before.site.fieldName).toBe('Cache field');
    const after = (await coordinator.get(`/api/sites/${siteId}/report`)).body as SiteReport;
    expect(after.site.fieldName).toBe('Renamed elsewhere');
  });

  it('answers a repeat read of an unchanged report with 304, and a changed one with the new body', async () => {
    const grower = await signIn(t.app, net.emails.grower);
    const siteId = built.siteIds[0]!;
    const first = await grower.get(`/api/sites/${siteId}/report`);
    const etag = first.headers.etag as string;
    expect(etag).toMatch(/^"[^"]+"$/);
    const repeat = await grower.agent.get(`/api/sites/${siteId}/report`).set('If-None-Match', etag);
    expect(repeat.status).toBe(304);
    expect(repeat.text).toBe('');

    const stripId = built.stripIds[0]![1]!;
    const strip = (await grower.get(`/api/strips/${stripId}`)).body as { version: number };
    await grower.patch(`/api/strips/${stripId}`, {
      version: strip.version,
      values: { notes: 'changed after the first read' },
    });
    const changed = await grower.agent
      .get(`/api/sites/${siteId}/report`)
      .set('If-None-Match', etag);
    expect(changed.status).toBe(200);
    expect(changed.headers.etag).not.toBe(etag);
  });

  it('gives a member and a coordinator different validators for the same site', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const grower = await signIn(t.app, net.emails.grower);
    const siteId = built.siteIds[0]!;
    const a = await coordinator.get(`/api/sites/${siteId}/report`);
    const b = await grower.get(`/api/sites/${siteId}/report`);
    // The coordinator may publish, the grower may not: their bodies differ, so must their ETags.
    expect(a.body.canPublish).toBe(true);
    expect(b.body.canPublish).toBe(false);
    expect(a.headers.etag).not.toBe(b.headers.etag);
  });
});
