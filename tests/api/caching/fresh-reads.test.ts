// Read caches must never hide a write: the data generation moves on every write this process
// makes, cached reports follow a strip change at once, and a write from another process shows
// within the cache's age limit. Runs against the real test PostgreSQL.
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SiteReport } from '../../../shared/schemas/report';
import { dataGeneration, mayWrite } from '../../../db/data-changes';
import { createFreshCache } from '../../../api/lib/fresh-cache';
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
} from '../reports/build-report-trial';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('which statements count as writes', () => {
  it('treats reads and row locks as reads, and anything that may change data as a write', () => {
    expect(mayWrite('SELECT id FROM sites WHERE id = $1')).toBe(false);
    expect(mayWrite('  select 1 from sites where id = $1 for update')).toBe(false);
    expect(mayWrite('SELECT * FROM strips FOR NO KEY UPDATE')).toBe(false);
    expect(mayWrite('SELECT s.updated_at FROM sites s')).toBe(false);
    expect(mayWrite('INSERT INTO audit_events (action) VALUES ($1)')).toBe(true);
    expect(
      mayWrite(
        'WITH bumped AS (UPDATE strips SET version = version + 1 RETURNING version) SELECT version FROM bumped',
      ),
    ).toBe(true);
    expect(mayWrite('DELETE FROM sites WHERE id = $1')).toBe(true);
    expect(mayWrite('TRUNCATE observations')).toBe(true);
    expect(mayWrite("SELECT setval('x', 1)")).toBe(true);
    // Unknown statements are writes: a false "write" costs a cache miss, a false "read" stale data.
    expect(mayWrite('CALL something()')).toBe(true);
  });
});

describe('the data generation', () => {
  it('stays put for reads and moves for a write, also after a transaction commits or rolls back', async () => {
    let before = dataGeneration();
    await t.dataSource.query('SELECT 1');
    expect(dataGeneration()).toBe(before);

    await t.dataSource.query(
      "UPDATE networks SET name = name WHERE id = '00000000-0000-0000-0000-000000000000'",
    );
    expect(dataGeneration()).toBeGreaterThan(before);

    before = dataGeneration();
    let insideTransaction = 0;
    await t.dataSource.transaction(async (manager) => {
      await manager.query('SELECT 1');
      insideTransaction = dataGeneration();
    });
    // A transaction's end always counts: its writes become visible at COMMIT.
    expect(dataGeneration()).toBeGreaterThan(insideTransaction);

    before = dataGeneration();
    await expect(
      t.dataSource.transaction(async (manager) => {
        await manager.query(
          "UPDATE networks SET name = name WHERE id = '00000000-0000-0000-0000-000000000000'",
        );
        throw new Error('roll back');
      }),
    ).rejects.toThrow('roll back');
    expect(dataGeneration()).toBeGreaterThan(before);
  });
});

describe('fresh caches', () => {
  it('answers from memory until a write, then recomputes', async () => {
    const cache = createFreshCache<number>();
    let computed = 0;
    const read = () => cache.get('k', async () => ++computed);
    expect(await read()).toBe(1);
    expect(await read()).toBe(1);
    await t.dataSource.query(
      "UPDATE networks SET name = name WHERE id = '00000000-0000-0000-0000-000000000000'",
    );
    expect(await read()).toBe(2);
  });

  it('shares one computation between concurrent misses', async () => {
    const cache = createFreshCache<number>();
    let computed = 0;
    const slow = () =>
      cache.get('k', async () => {
        computed += 1;
        await sleep(20);
        return computed;
      });
    const answers = await Promise.all([slow(), slow(), slow()]);
    expect(answers).toEqual([1, 1, 1]);
    expect(computed).toBe(1);
  });

  it('does not keep a value computed while a write happened', async () => {
    const cache = createFreshCache<string>();
    const first = cache.get('k', async () => {
      await t.dataSource.query(
        "UPDATE networks SET name = name WHERE id = '00000000-0000-0000-0000-000000000000'",
      );
      return 'during';
    });
    expect(await first).toBe('during');
    expect(await cache.get('k', async () => 'after')).toBe('after');
  });

  it('does not keep failures', async () => {
    const cache = createFreshCache<string>();
    await expect(cache.get('k', async () => Promise.reject(new Error('no')))).rejects.toThrow('no');
    expect(await cache.get('k', async () => 'yes')).toBe('yes');
  });

  it('keeps facts that never change across writes, until their age limit', async () => {
    const cache = createFreshCache<number>({
      keepAcrossWrites: true,
      maxAgeMs: 60,
      refreshAfterMs: 60,
    });
    let computed = 0;
    const read = () => cache.get('k', async () => ++computed);
    expect(await read()).toBe(1);
    await t.dataSource.query(
      "UPDATE networks SET name = name WHERE id = '00000000-0000-0000-0000-000000000000'",
    );
    expect(await read()).toBe(1);
    await sleep(80);
    expect(await read()).toBe(2);
  });

  it('does not let a background refresh that started before a delete put the old value back', async () => {
    const cache = createFreshCache<string>({
      keepAcrossWrites: true,
      maxAgeMs: 1000,
      refreshAfterMs: 20,
    });
    let stored = 'old';
    const read = () =>
      cache.get('session', async () => {
        const seen = stored;
        await sleep(30);
        return seen;
      });
    expect(await read()).toBe('old');
    await sleep(30);
    const served = read(); // starts a background refresh that will see 'old'
    stored = 'new';
    cache.delete('session'); // the session was rewritten meanwhile
    expect(await served).toBe('old');
    await sleep(40); // the refresh finishes and must be dropped
    expect(await read()).toBe('new');
  });

  it('refreshes an ageing entry in the background and serves the old value meanwhile', async () => {
    const cache = createFreshCache<number>({ maxAgeMs: 1000, refreshAfterMs: 30 });
    let computed = 0;
    const read = () => cache.get('k', async () => ++computed);
    expect(await read()).toBe(1);
    await sleep(50);
    expect(await read()).toBe(1);
    await sleep(5);
    expect(await read()).toBe(2);
  });
});

describe('cached reports follow the data', () => {
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

  it('shows a write from another process within the age limit', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const siteId = built.siteIds[0]!;
    const before = (await coordinator.get(`/api/sites/${siteId}/report`)).body as SiteReport;
    // A separate connection outside TypeORM stands in for psql or a second server.
    const other = new pg.Client({ connectionString: testDatabaseUrl() });
    await other.connect();
    try {
      await other.query(
        `UPDATE sites SET field_name = 'Renamed elsewhere', data_version = data_version + 1 WHERE id = $1`,
        [siteId],
      );
    } finally {
      await other.end();
    }
    expect(before.site.fieldName).toBe('Cache field');
    let seen = '';
    const started = Date.now();
    while (Date.now() - started < 8000) {
      seen = ((await coordinator.get(`/api/sites/${siteId}/report`)).body as SiteReport).site
        .fieldName;
      if (seen === 'Renamed elsewhere') break;
      await sleep(250);
    }
    expect(seen).toBe('Renamed elsewhere');
    // The age limit of cached answers is 5 s.
    expect(Date.now() - started).toBeLessThan(6000);
  });
});
