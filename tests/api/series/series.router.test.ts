// Series of trials across seasons: who may start, link and read them, and the series report.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SeriesReportSchema } from '../../../shared/schemas/series';
import {
  buildNetwork,
  createTestApp,
  signIn,
  type BuiltNetwork,
  type Client,
  type TestApp,
} from '../../helpers/app';
import { buildReportTrial, type SiteSpec } from '../reports/build-report-trial';

/** Three sites × 3 blocks × 4 rates with a season shift; deterministic invented yields. */
function sites(season: number, shift: number): SiteSpec[] {
  return [0, 1, 2].map((s) => ({
    fieldName: `Field ${season}-${s + 1}`,
    strips: [1, 2, 3].flatMap((block) =>
      [0, 1, 2, 3].map((level) => ({
        block,
        level,
        yield: 50 + shift + 4 * s + 6 * Math.min(level, 2) + ((block * 7 + level * 3 + s) % 5),
      })),
    ),
  }));
}

describe('series across seasons', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let other: BuiltNetwork;
  let coordinator: Client;
  let member: Client;
  let otherCoordinator: Client;
  let seriesId: string;
  const trialIds: string[] = [];

  beforeAll(async () => {
    t = await createTestApp();
    [net, other] = [
      await buildNetwork(t.dataSource, 'Series'),
      await buildNetwork(t.dataSource, 'Series other'),
    ];
    coordinator = await signIn(t.app, net.emails.coordinator);
    member = await signIn(t.app, net.emails.member);
    otherCoordinator = await signIn(t.app, other.emails.coordinator);
    for (const [season, shift] of [
      ['2026', -6],
      ['2027', 0],
    ] as const) {
      const built = await buildReportTrial(t.dataSource, net, {
        name: `Wheat ${season}`,
        sites: sites(Number(season), shift),
      });
      await t.dataSource.query('UPDATE trials SET season = $2 WHERE id = $1', [
        built.trialId,
        season,
      ]);
      trialIds.push(built.trialId);
    }
  });
  afterAll(() => t.close());

  it('lets a coordinator start a series and refuses growers and members', async () => {
    const created = await coordinator.post('/api/series', {
      name: 'Wheat over the years',
      crop: 'wheat',
    });
    expect(created.status).toBe(201);
    expect(created.body.networkId).toBe(net.networkId);
    seriesId = created.body.id;
    const grower = await signIn(t.app, net.emails.grower);
    expect((await grower.post('/api/series', { name: 'Mine', crop: 'wheat' })).status).toBe(403);
    expect((await member.post('/api/series', { name: 'Mine', crop: 'wheat' })).status).toBe(403);
    const bad = await coordinator.post('/api/series', { name: 'x', crop: 'maize' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(expect.arrayContaining(['name', 'crop']));
    // Another network's coordinator naming this network gets 404, as for any of its resources.
    const foreign = await otherCoordinator.post('/api/series', {
      name: 'Not yours',
      crop: 'wheat',
      networkId: net.networkId,
    });
    expect(foreign.status).toBe(404);
  });

  it('links trials of its crop and refuses another crop or another network, naming the field', async () => {
    for (const trialId of trialIds) {
      const res = await coordinator.put(`/api/trials/${trialId}/series`, { seriesId });
      expect(res.status).toBe(200);
    }
    const barley = await buildReportTrial(t.dataSource, net, {
      name: 'Barley',
      crop: 'barley',
      sites: [],
    });
    const wrongCrop = await coordinator.put(`/api/trials/${barley.trialId}/series`, { seriesId });
    expect(wrongCrop.status).toBe(400);
    expect(wrongCrop.body.error.fields.seriesId).toMatch(
      /series is for Winter wheat; the trial is Barley/,
    );
    const theirs = await buildReportTrial(t.dataSource, other, { name: 'Their wheat', sites: [] });
    const otherNetwork = await otherCoordinator.put(`/api/trials/${theirs.trialId}/series`, {
      seriesId,
    });
    expect(otherNetwork.status).toBe(400);
    expect(otherNetwork.body.error.fields.seriesId).toBeDefined();
    // Two networks side by side: each sees only its own series.
    expect((await otherCoordinator.get(`/api/series/${seriesId}`)).status).toBe(404);
    expect((await otherCoordinator.get(`/api/series/${seriesId}/report`)).status).toBe(404);
    const theirList = await otherCoordinator.get('/api/series');
    expect(theirList.body.map((s: { id: string }) => s.id)).not.toContain(seriesId);
    const ours = await coordinator.get(`/api/series/${seriesId}`);
    expect(ours.body.trials.map((trial: { season: string }) => trial.season)).toEqual([
      '2026',
      '2027',
    ]);
    expect(ours.body.canEdit).toBe(true);
  });

  it('pools both seasons for the coordinator, with an ETag that answers 304 until data change', async () => {
    const res = await coordinator.get(`/api/series/${seriesId}/report`);
    expect(res.status).toBe(200);
    const report = SeriesReportSchema.parse(res.body);
    expect(report.seasons.map((s) => [s.season, s.sites])).toEqual([
      ['2026', 3],
      ['2027', 3],
    ]);
    expect(report.means.rows).toHaveLength(4);
    // Common practice, no published source: with the same design in both seasons, the pooled
    // rate mean lies between the two seasons' own means.
    for (const row of report.means.rows) {
      const [a, b] = row.seasons as number[];
      expect(row.pooled!.mean).toBeGreaterThanOrEqual(Math.min(a!, b!) - 1e-9);
      expect(row.pooled!.mean).toBeLessThanOrEqual(Math.max(a!, b!) + 1e-9);
    }
    expect(report.findings.join(' ')).toMatch(/in \d of 2 seasons/);
    expect(report.statistician.varianceComponents.map((c) => c.name)).toContain('seasonByRate');
    const etag = res.headers.etag as string;
    const again = await coordinator
      .get(`/api/series/${seriesId}/report`)
      .set('If-None-Match', etag);
    expect(again.status).toBe(304);
    await t.dataSource.query(
      'UPDATE sites SET data_version = data_version + 1 WHERE trial_id = $1',
      [trialIds[0]],
    );
    const changed = await coordinator
      .get(`/api/series/${seriesId}/report`)
      .set('If-None-Match', etag);
    expect(changed.status).toBe(200);
    expect(changed.headers.etag).not.toBe(etag);
  });

  it('shows a member only seasons whose pooled report is published', async () => {
    const res = await member.get(`/api/series/${seriesId}/report`);
    expect(res.status).toBe(200);
    expect(res.body.seasons).toEqual([]);
    expect(res.body.unpublishedTrials).toBe(2);
    expect(res.body.canLink).toBe(false);
  });

  it('links the invented demo’s 2026 and 2027 oat trials in one series', async () => {
    const demo = await signIn(t.app, 'coordinator@millbrook.example');
    const list = await demo.get('/api/series');
    const series = list.body.find((s: { crop: string }) => s.crop === 'hullessOats');
    expect(
      series.trials.map((trial: { season: string; status: string }) => [
        trial.season,
        trial.status,
      ]),
    ).toEqual([
      ['2026', 'closed'],
      ['2027', 'in-field'],
    ]);
    const report = SeriesReportSchema.parse(
      (await demo.get(`/api/series/${series.id}/report`)).body,
    );
    expect(report.seasons.map((s) => s.sites)).toEqual([6, 8]);
    expect(report.means.rows.every((row) => row.pooled !== null)).toBe(true);
    // The demo member sees the published 2026 season only.
    const demoMember = await signIn(t.app, 'member@millbrook.example');
    const memberView = (await demoMember.get(`/api/series/${series.id}/report`)).body;
    expect(memberView.seasons.map((s: { season: string }) => s.season)).toEqual(['2026']);
    expect(memberView.unpublishedTrials).toBe(1);
  });
});
