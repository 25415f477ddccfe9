import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  buildNetwork,
  signIn,
  type BuiltNetwork,
  type Client,
  type TestApp,
} from '../../helpers/app';
import {
  buildCollectSite,
  dataVersion,
  openCollectSite,
  publishSite,
  stripVersion,
  type CollectSite,
} from './collect-builders';

describe('strip data: GET /api/sites/:siteId/strips and PATCH /api/strips/:stripId', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let site: CollectSite;
  let grower: Client;
  let coordinator: Client;

  beforeAll(async () => {
    ({ t, net, site, grower, coordinator } = await openCollectSite('Strips'));
  });
  afterAll(() => t.close());

  it('lists the site context and every strip with values, derived numbers and what is recorded', async () => {
    const res = await grower.get(`/api/sites/${site.siteId}/strips`);
    expect(res.status).toBe(200);
    expect(res.body.site).toMatchObject({
      siteId: site.siteId,
      unitSystem: 'imperial',
      crop: 'oats',
      canEdit: true,
      isCoordinator: false,
      publishedAt: null,
      rowSpacingIn: 8,
    });
    expect(res.body.site.rateLevels.map((l: { label: string }) => l.label)).toEqual([
      'half',
      'full',
      'double',
    ]);
    expect(res.body.strips).toHaveLength(6);
    const first = res.body.strips[0];
    expect(first).toMatchObject({
      block: 1,
      position: 1,
      version: 1,
      recorded: { stand: false, tillers: false, heads: false, yield: false },
    });
    expect(first.values.standCounts).toEqual([]);
    expect(first.derived.yieldBushelsPerAcre).toBeNull();
    // The target seeds/ft² is known from the trial before anything is counted.
    expect(first.derived.targetSeedsPerSquareFoot).toBeGreaterThan(0);
  });

  it('saves a partial edit, bumps the strip version and the site data_version, and records old and new values', async () => {
    const strip = site.strips[0]!;
    const before = await dataVersion(t.dataSource, site.siteId);
    const res = await grower.patch(`/api/strips/${strip.id}`, {
      version: 1,
      values: { standCounts: [20, 22, 21], standRowLength: 3 },
    });
    expect(res.status).toBe(200);
    expect(res.body.version).toBe(2);
    expect(res.body.values.standCounts).toEqual([20, 22, 21]);
    expect(res.body.recorded.stand).toBe(true);
    // 63 plants on 3 × 3 ft of 8-inch row = 63 ÷ 6 ft² = 10.5 plants/ft² [PSU-WS].
    expect(res.body.derived.plantsPerSquareFoot).toBeCloseTo(10.5, 10);
    expect(await dataVersion(t.dataSource, site.siteId)).toBe(before + 1);
    // The answer is built from what the change wrote, without reading it back: a fresh read
    // must give the very same strip.
    expect((await grower.get(`/api/strips/${strip.id}`)).body).toEqual(res.body);
    const [event] = await t.dataSource.query(
      `SELECT * FROM audit_events WHERE entity_id = $1 ORDER BY created_at DESC LIMIT 1`,
      [strip.id],
    );
    expect(event).toMatchObject({
      actor_user_id: net.userIds.grower,
      site_id: site.siteId,
      action: 'update',
    });
    expect(event.before).toEqual({ standCounts: [], standRowLength: null });
    expect(event.after).toEqual({ standCounts: [20, 22, 21], standRowLength: 3 });
  });

  it('returns 409 with the current strip when the version is stale, and loses no update', async () => {
    const strip = site.strips[1]!;
    const version = await stripVersion(t.dataSource, strip.id);
    const first = await grower.patch(`/api/strips/${strip.id}`, {
      version,
      values: { grainWeight: 4.2, moisturePct: 13 },
    });
    expect(first.status).toBe(200);
    const second = await coordinator.patch(`/api/strips/${strip.id}`, {
      version,
      values: { grainWeight: 5.5 },
    });
    expect(second.status).toBe(409);
    expect(second.body.error.code).toBe('conflict');
    expect(second.body.error.current).toMatchObject({
      stripId: strip.id,
      version: version + 1,
      values: { grainWeight: 4.2, moisturePct: 13 },
    });
    // The first edit stands.
    const [row] = await t.dataSource.query(
      'SELECT grain_weight, moisture_pct FROM observations WHERE strip_id = $1',
      [strip.id],
    );
    expect(Number(row.grain_weight)).toBe(4.2);
    // Overwriting on purpose: send again with the current version.
    const overwrite = await coordinator.patch(`/api/strips/${strip.id}`, {
      version: second.body.error.current.version,
      values: { grainWeight: 5.5 },
    });
    expect(overwrite.status).toBe(200);
    expect(overwrite.body.values).toMatchObject({ grainWeight: 5.5, moisturePct: 13 });
  });

  it('lets exactly one of two simultaneous edits of the same version through', async () => {
    const strip = site.strips[2]!;
    const version = await stripVersion(t.dataSource, strip.id);
    const [a, b] = await Promise.all([
      grower.patch(`/api/strips/${strip.id}`, { version, values: { notes: 'from the phone' } }),
      coordinator.patch(`/api/strips/${strip.id}`, { version, values: { notes: 'from the desk' } }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const winner = a.status === 200 ? a : b;
    const [row] = await t.dataSource.query('SELECT notes FROM observations WHERE strip_id = $1', [
      strip.id,
    ]);
    expect(row.notes).toBe(winner.body.values.notes);
    expect(await stripVersion(t.dataSource, strip.id)).toBe(version + 1);
  });

  it('keeps the version when the values sent are already stored (a resent edit)', async () => {
    const strip = site.strips[0]!;
    const version = await stripVersion(t.dataSource, strip.id);
    const stale = await grower.patch(`/api/strips/${strip.id}`, {
      version: version - 1,
      values: { standCounts: [20, 22, 21] },
    });
    expect(stale.status).toBe(200);
    expect(stale.body.version).toBe(version);
    const same = await grower.patch(`/api/strips/${strip.id}`, {
      version,
      values: { standRowLength: 3 },
    });
    expect(same.status).toBe(200);
    expect(same.body.version).toBe(version);
  });

  it('rejects invalid values with 400 and the field named', async () => {
    const strip = site.strips[3]!;
    const res = await grower.patch(`/api/strips/${strip.id}`, {
      version: 1,
      values: { moisturePct: -2, standCounts: [1, 2, 3, 4, 5, 6, 7] },
    });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(Object.keys(res.body.error.fields)).toEqual(
      expect.arrayContaining(['values.moisturePct', 'values.standCounts']),
    );
  });

  it('stores HTML and formula-like notes as plain text', async () => {
    const strip = site.strips[4]!;
    const notes = `<img src=x onerror=alert(1)> =cmd|' /C calc'!A0`;
    const res = await grower.patch(`/api/strips/${strip.id}`, { version: 1, values: { notes } });
    expect(res.status).toBe(200);
    const [row] = await t.dataSource.query('SELECT notes FROM observations WHERE strip_id = $1', [
      strip.id,
    ]);
    expect(row.notes).toBe(notes);
  });

  it('answers 423 once the site report is published, and lists the strips read-only', async () => {
    const net2 = await buildNetwork(t.dataSource, 'Strips locked');
    const locked = await buildCollectSite(t.dataSource, net2);
    await publishSite(t.dataSource, locked.siteId);
    const owner = await signIn(t.app, net2.emails.grower);
    const res = await owner.patch(`/api/strips/${locked.strips[0]!.id}`, {
      version: 1,
      values: { notes: 'late' },
    });
    expect(res.status).toBe(423);
    expect(res.body.error.code).toBe('locked');
    expect(res.body.error.message).toMatch(/published/);
    const coord = await signIn(t.app, net2.emails.coordinator);
    expect(
      (
        await coord.patch(`/api/strips/${locked.strips[0]!.id}`, {
          version: 1,
          values: { notes: 'late' },
        })
      ).status,
    ).toBe(423);
    const list = await owner.get(`/api/sites/${locked.siteId}/strips`);
    expect(list.body.site.canEdit).toBe(false);
    expect(await stripVersion(t.dataSource, locked.strips[0]!.id)).toBe(1);
    // Unpublishing opens the data again.
    await t.dataSource.query('UPDATE sites SET published_at = NULL WHERE id = $1', [locked.siteId]);
    expect(
      (
        await owner.patch(`/api/strips/${locked.strips[0]!.id}`, {
          version: 1,
          values: { notes: 'late' },
        })
      ).status,
    ).toBe(200);
  });

  it('waits for a publish in progress and then refuses the change, writing nothing', async () => {
    const net3 = await buildNetwork(t.dataSource, 'Strips race');
    const racing = await buildCollectSite(t.dataSource, net3);
    const strip = racing.strips[0]!;
    const owner = await signIn(t.app, net3.emails.grower);
    const versionBefore = await dataVersion(t.dataSource, racing.siteId);
    // A coordinator's publish holds the site row; the grower's change arrives meanwhile.
    const publishing = t.dataSource.createQueryRunner();
    await publishing.connect();
    await publishing.startTransaction();
    await publishing.query('SELECT id FROM sites WHERE id = $1 FOR UPDATE', [racing.siteId]);
    const change = owner.patch(`/api/strips/${strip.id}`, {
      version: 1,
      values: { notes: 'too late' },
    });
    await new Promise((resolve) => setTimeout(resolve, 300));
    await publishing.query('UPDATE sites SET published_at = now() WHERE id = $1', [racing.siteId]);
    await publishing.commitTransaction();
    await publishing.release();
    expect((await change).status).toBe(423);
    expect(await stripVersion(t.dataSource, strip.id)).toBe(1);
    expect(await dataVersion(t.dataSource, racing.siteId)).toBe(versionBefore);
    const audits = await t.dataSource.query(`SELECT 1 FROM audit_events WHERE entity_id = $1`, [
      strip.id,
    ]);
    expect(audits).toHaveLength(0);
    const notes = await t.dataSource.query('SELECT notes FROM observations WHERE strip_id = $1', [
      strip.id,
    ]);
    expect(notes.map((r: { notes: string }) => r.notes)).not.toContain('too late');
  });

  it('warns about a yield outlier by the site analysis’s Bonferroni outlier test, with the adjusted p', async () => {
    const net3 = await buildNetwork(t.dataSource, 'Strips outlier');
    const levels = [
      { multiplier: 0.5, label: 'half' },
      { multiplier: 1, label: 'full' },
      { multiplier: 2, label: 'double' },
    ];
    const big = await buildCollectSite(t.dataSource, net3, { blocks: 6, levels });
    const owner = await signIn(t.app, net3.emails.grower);
    // Yields near 3 lb per strip with small noise; one strip weighs ten times more.
    const noise = [
      0.02, -0.03, 0.01, 0.04, -0.02, 0.03, -0.01, 0.02, -0.04, 0.01, 0.03, -0.02, 0.02, -0.01, 0.0,
      0.01, -0.03, 0.02,
    ];
    for (const [i, strip] of big.strips.entries()) {
      const grainWeight =
        i === 7 ? 30 : 3 + strip.multiplier * 0.1 + strip.block * 0.05 + noise[i]!;
      const res = await owner.patch(`/api/strips/${strip.id}`, {
        version: 1,
        values: {
          grainWeight: Number(grainWeight.toFixed(3)),
          moisturePct: 14,
          harvestRows: 4,
          harvestLength: 50,
        },
      });
      expect(res.status).toBe(200);
    }
    const list = await owner.get(`/api/sites/${big.siteId}/strips`);
    const flagged = list.body.strips.filter((s: { warnings: string[] }) =>
      s.warnings.some((w) => /than chance explains, .*Bonferroni-adjusted p < 0\.001\)/.test(w)),
    );
    expect(flagged.map((s: { stripId: string }) => s.stripId)).toEqual([big.strips[7]!.id]);
  });
});
