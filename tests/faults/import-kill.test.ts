// The server killed (SIGKILL) in the middle of a CSV import: after a restart the site holds
// either every row of the file or none of them.
import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildNetwork, createTestApp, type TestApp } from '../helpers/app';
import { exitOf, freePort, signInOverHttp, startServerProcess } from '../helpers/server-process';

const BLOCKS = 1250; // × 4 rates = 5,000 strips, so the import takes long enough to interrupt

describe('SIGKILL during a CSV import', () => {
  let t: TestApp;
  let siteId = '';
  let coordinatorEmail = '';
  let child: ChildProcess | null = null;

  beforeAll(async () => {
    t = await createTestApp();
    const net = await buildNetwork(t.dataSource, 'Import kill');
    coordinatorEmail = net.emails.coordinator;
    const q = (sql: string, params: unknown[]) => t.dataSource.query(sql, params);
    const [trial] = await q(
      `INSERT INTO trials (network_id, name, status, crop, season, reference_rate, reference_unit, blocks_per_site, rows_per_strip,
         row_spacing_in, strip_length_ft, border_rows, thousand_kernel_weight_g, germination_pct, emergence_pct)
       VALUES ($1, 'Kill test', 'in-field', 'oats', '2027', 90, 'lb/acre', 12, 4, 8, 50, 1, 32, 90, 85) RETURNING id`,
      [net.networkId],
    );
    await q(
      `INSERT INTO rate_levels (trial_id, position, multiplier, label)
       SELECT $1, p, (ARRAY[0.25, 0.5, 1, 2])[p], (ARRAY['quarter','half','full','double'])[p] FROM generate_series(1, 4) p`,
      [trial.id],
    );
    const [site] = await q(
      `INSERT INTO sites (trial_id, grower_user_id, field_name, randomization_seed, randomized_at) VALUES ($1, $2, 'Kill field', 'k', now()) RETURNING id`,
      [trial.id, net.userIds.grower],
    );
    await q(
      `INSERT INTO strips (site_id, block, position, rate_level_id)
       SELECT $1, b, p, r.id FROM generate_series(1, ${BLOCKS}) b CROSS JOIN generate_series(1, 4) p
         JOIN rate_levels r ON r.trial_id = $2 AND r.position = ((p + b) % 4) + 1`,
      [site.id, trial.id],
    );
    siteId = site.id;
  });
  afterAll(async () => {
    if (child && child.exitCode === null) child.kill('SIGKILL');
    await t.close();
  });

  async function countWithWeight(weight: number): Promise<number> {
    const [row] = await t.dataSource.query(
      `SELECT count(*)::int AS n FROM observations o JOIN strips s ON s.id = o.strip_id WHERE s.site_id = $1 AND o.grain_weight = $2`,
      [siteId, weight],
    );
    return row.n;
  }

  it('leaves all or none of the file after each kill, and the restarted server serves the site', async () => {
    const port = await freePort();
    const base = `http://127.0.0.1:${port}`;
    child = await startServerProcess(port);
    let headers = await signInOverHttp(base, coordinatorEmail);
    const template = await (
      await fetch(`${base}/api/sites/${siteId}/import-template.csv`, { headers })
    ).text();
    const lines = template.trim().split(/\r?\n/);
    const header = lines[0]!.split(',');
    const weightColumn = header.indexOf('grain_weight_lb');
    expect(weightColumn).toBeGreaterThan(0);
    const fileWithWeight = (weight: number) =>
      [
        lines[0],
        ...lines.slice(1).map((line) => {
          const cells = line.split(',');
          cells[weightColumn] = weight.toFixed(2);
          return cells.join(',');
        }),
      ].join('\n');

    let interrupted = 0;
    const delays = [60, 250, 600, 1200];
    for (const [i, delay] of delays.entries()) {
      const weight = 3 + i / 10;
      const form = new FormData();
      form.append('file', new Blob([fileWithWeight(weight)], { type: 'text/csv' }), 'strips.csv');
      const upload = fetch(`${base}/api/sites/${siteId}/import`, {
        method: 'POST',
        headers,
        body: form,
      }).then(
        (res) => res.status,
        () => 'killed' as const,
      );
      await new Promise((r) => setTimeout(r, delay));
      child.kill('SIGKILL');
      const outcome = await upload;
      await exitOf(child);
      if (outcome === 'killed') interrupted += 1;

      const stored = await countWithWeight(weight);
      expect([0, lines.length - 1], `after a kill at ${delay} ms (${outcome})`).toContain(stored);
      if (outcome === 200) expect(stored).toBe(lines.length - 1);

      child = await startServerProcess(port);
      headers = await signInOverHttp(base, coordinatorEmail);
    }
    // At least one kill must have landed before the import answered, or nothing was tested.
    expect(interrupted).toBeGreaterThan(0);

    const strips = await fetch(`${base}/api/sites/${siteId}/strips`, { headers });
    expect(strips.status).toBe(200);
    child.kill('SIGTERM');
    await exitOf(child);
  }, 240_000);
});
