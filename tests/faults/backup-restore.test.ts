// npm run db:backup writes a pg_dump file; npm run db:restore FILE restores it into an
// empty database; the demo data must come back whole.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { afterAll, describe, expect, it } from 'vitest';
import { analyzeTrial } from '../../shared/analysis/index';
import { testDatabaseUrl } from '../helpers/app';

const TABLES = [
  'users',
  'networks',
  'memberships',
  'trials',
  'rate_levels',
  'sites',
  'strips',
  'observations',
  'audit_events',
  'report_snapshots',
];

async function snapshot(url: string) {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const counts: Record<string, number> = {};
    for (const table of TABLES)
      counts[table] = Number((await client.query(`SELECT count(*) FROM ${table}`)).rows[0].count);
    const { rows } = await client.query(
      `SELECT s.field_name AS site, st.block, r.multiplier, o.grain_weight
         FROM strips st JOIN sites s ON s.id = st.site_id JOIN trials t ON t.id = s.trial_id
         JOIN rate_levels r ON r.id = st.rate_level_id JOIN observations o ON o.strip_id = st.id
        WHERE t.name = 'Hulless oat seeding rate 2027' ORDER BY 1, 2, 3`,
    );
    const analysis = analyzeTrial(
      rows.map((r) => ({
        site: r.site,
        block: String(r.block),
        rate: Number(r.multiplier),
        value: Number(r.grain_weight),
      })),
      { response: 'grain weight' },
    );
    return { counts, analysis };
  } finally {
    await client.end();
  }
}

describe('database backup and restore', () => {
  const file = path.resolve(`.data/test-backup-${process.pid}.dump`);
  const restoredName = `sheaf_restored_${process.pid}`;
  const superUrl = process.env.SHEAF_TEST_PG_SUPER_URL!;
  afterAll(async () => {
    fs.rmSync(file, { force: true });
    const admin = new pg.Client({ connectionString: superUrl.replace(/\/[^/]+$/, '/postgres') });
    await admin.connect();
    await admin.query(`DROP DATABASE IF EXISTS ${restoredName}`);
    await admin.end();
  });

  it('round-trips the demo data through db:backup and db:restore', async () => {
    const sourceUrl = testDatabaseUrl();
    execFileSync('npm', ['run', '--silent', 'db:backup', '--', file], {
      env: { ...process.env, DATABASE_URL: sourceUrl },
      stdio: 'pipe',
    });
    expect(fs.statSync(file).size).toBeGreaterThan(10_000);

    const admin = new pg.Client({ connectionString: superUrl.replace(/\/[^/]+$/, '/postgres') });
    await admin.connect();
    await admin.query(`CREATE DATABASE ${restoredName} OWNER sheaf`);
    await admin.end();
    const restoredUrl = sourceUrl.replace(/\/[^/]+$/, `/${restoredName}`);
    execFileSync('npm', ['run', '--silent', 'db:restore', '--', file], {
      env: { ...process.env, DATABASE_URL: restoredUrl },
      stdio: 'pipe',
    });

    const before = await snapshot(sourceUrl);
    const after = await snapshot(restoredUrl);
    expect(after.counts).toEqual(before.counts);
    expect(after.counts.strips).toBeGreaterThanOrEqual(128);
    expect(after.analysis).toEqual(before.analysis);
  });

  it('refuses to restore over a database that already has tables', () => {
    expect(() =>
      execFileSync('npm', ['run', '--silent', 'db:restore', '--', file], {
        env: { ...process.env, DATABASE_URL: testDatabaseUrl() },
        stdio: 'pipe',
      }),
    ).toThrow();
  });
});
