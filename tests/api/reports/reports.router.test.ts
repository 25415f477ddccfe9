// Publishing, snapshots, access, the public link and the exports of site and pooled reports.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PooledReport, SiteReport } from '../../../shared/schemas/report';
import {
  buildNetwork,
  clientFor,
  createTestApp,
  signIn,
  type BuiltNetwork,
  type TestApp,
} from '../../helpers/app';
import {
  buildReportTrial,
  grainWeightFor,
  rcbdStrips,
  type BuiltTrial,
  type TrialSpec,
} from './build-report-trial';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

/** Three complete wheat sites (4 rates × 4 blocks) with a clear drop at quarter rate. */
function threeSites(net: BuiltNetwork): TrialSpec {
  const site = (shift: number, name: string, growerUserId: string | null, soil: string) => ({
    fieldName: name,
    growerUserId,
    soil,
    // Each site gets its own small strip-to-strip wobble so site × rate is not zero.
    strips: rcbdStrips(
      [
        [40, 52, 55, 56],
        [42, 54, 53, 55],
        [39, 51, 56, 54],
        [41, 55, 54, 57],
      ].map((row, b) =>
        row.map(
          (value, level) => value + shift + (((b * 3 + level * 7 + shift * 5) % 5) - 2) * 0.7,
        ),
      ),
    ),
  });
  return {
    sites: [
      site(0, 'North field', net.userIds.grower, 'loam'),
      site(6, 'River flat', net.userIds.grower2, 'silt loam'),
      site(-4, 'Ridge = top', null, 'loam'),
    ],
  };
}

describe('site report publishing', () => {
  let net: BuiltNetwork;
  let built: BuiltTrial;
  beforeAll(async () => {
    net = await buildNetwork(t.dataSource, 'Reports');
    built = await buildReportTrial(t.dataSource, net, threeSites(net));
  });

  it('answers 403 to a member before publishing and 200 with the snapshot after', async () => {
    const member = await signIn(t.app, net.emails.member);
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const siteId = built.siteIds[0]!;
    expect((await member.get(`/api/sites/${siteId}/report`)).status).toBe(403);

    const published = await coordinator.post(`/api/sites/${siteId}/publish`);
    expect(published.status).toBe(200);
    expect((published.body as SiteReport).published).not.toBeNull();

    const read = await member.get(`/api/sites/${siteId}/report`);
    expect(read.status).toBe(200);
    const report = read.body as SiteReport;
    expect(report.fromSnapshot).toBe(true);
    expect(report.analysis!.means).toHaveLength(4);
    expect(report.published!.dataVersion).toBe('1');
    const [site] = await t.dataSource.query('SELECT published_at FROM sites WHERE id = $1', [
      siteId,
    ]);
    expect(site.published_at).not.toBeNull();
  });

  it('e-mails the grower a link to the site report when it is published', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const siteId = built.siteIds[1]!;
    const res = await coordinator.post(`/api/sites/${siteId}/publish`);
    expect(res.status).toBe(200);
    expect(res.headers['x-sheaf-grower-mailed']).toBe('yes');
    const mail = await t.mailCatcher.waitFor(
      (m) => m.to.includes(net.emails.grower2) && /site report/i.test(m.subject),
    );
    expect(mail.text).toContain(`http://sheaf.test/sites/${siteId}/report`);
    expect(mail.html).toContain(`/sites/${siteId}/report`);
  });

  it('keeps the published numbers when data change, and flags the change until re-publishing', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const member = await signIn(t.app, net.emails.member);
    const siteId = built.siteIds[0]!;
    const before = (await member.get(`/api/sites/${siteId}/report`)).body as SiteReport;

    // A correction lands on one strip (as an unlock-edit-relock by the coordinator would).
    const stripId = built.stripIds[0]![0]!;
    const { grainWeight } = grainWeightFor({ sites: [] }, 20);
    await t.dataSource.query('UPDATE observations SET grain_weight = $2 WHERE strip_id = $1', [
      stripId,
      grainWeight,
    ]);
    await t.dataSource.query('UPDATE sites SET data_version = data_version + 1 WHERE id = $1', [
      siteId,
    ]);

    const memberView = (await member.get(`/api/sites/${siteId}/report`)).body as SiteReport;
    expect(memberView.analysis!.means).toEqual(before.analysis!.means);
    expect(memberView.dataChangedSincePublished).toBe(true);

    const live = (await coordinator.get(`/api/sites/${siteId}/report`)).body as SiteReport;
    expect(live.fromSnapshot).toBe(false);
    expect(live.dataChangedSincePublished).toBe(true);
    expect(live.analysis!.means.find((m) => m.rate === '0.25')!.mean).not.toBeCloseTo(
      before.analysis!.means.find((m) => m.rate === '0.25')!.mean,
      3,
    );

    const republished = (await coordinator.post(`/api/sites/${siteId}/publish`)).body as SiteReport;
    expect(republished.dataChangedSincePublished).toBe(false);
    const after = (await member.get(`/api/sites/${siteId}/report`)).body as SiteReport;
    expect(after.analysis!.means).toEqual(live.analysis!.means);
    const snapshots = await t.dataSource.query(
      `SELECT withdrawn_at FROM report_snapshots WHERE site_id = $1 ORDER BY published_at`,
      [siteId],
    );
    expect(
      snapshots.filter((s: { withdrawn_at: Date | null }) => s.withdrawn_at === null),
    ).toHaveLength(1);
  });

  it('unpublishes: clears the lock and answers 403 to members again', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const member = await signIn(t.app, net.emails.member);
    const siteId = built.siteIds[1]!;
    const res = await coordinator.post(`/api/sites/${siteId}/unpublish`);
    expect(res.status).toBe(200);
    expect((res.body as SiteReport).published).toBeNull();
    const [site] = await t.dataSource.query('SELECT published_at FROM sites WHERE id = $1', [
      siteId,
    ]);
    expect(site.published_at).toBeNull();
    expect((await member.get(`/api/sites/${siteId}/report`)).status).toBe(403);
  });

  it('lets a grower read their own live report but not another grower’s unpublished one', async () => {
    const grower = await signIn(t.app, net.emails.grower);
    expect((await grower.get(`/api/sites/${built.siteIds[0]}/report`)).status).toBe(200);
    expect((await grower.get(`/api/sites/${built.siteIds[2]}/report`)).status).toBe(403);
  });

  it('refuses publishing by a member or a grower', async () => {
    const member = await signIn(t.app, net.emails.member);
    const grower = await signIn(t.app, net.emails.grower);
    expect((await member.post(`/api/sites/${built.siteIds[2]}/publish`)).status).toBe(403);
    expect((await grower.post(`/api/sites/${built.siteIds[0]}/publish`)).status).toBe(403);
  });
});

describe('pooled report publishing and the public link', () => {
  let net: BuiltNetwork;
  let built: BuiltTrial;
  beforeAll(async () => {
    net = await buildNetwork(t.dataSource, 'Pooled');
    const spec = threeSites(net);
    // A fourth site with yields on only half of its strips is left out as incomplete.
    spec.sites.push({
      fieldName: 'Late field',
      strips: rcbdStrips([
        [40, 50, 52, 53],
        [41, 49, 51, 52],
        [null, null, null, null],
        [null, null, null, null],
      ]),
    });
    built = await buildReportTrial(t.dataSource, net, spec);
  });

  it('says which sites are in and why others are left out', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const report = (await coordinator.get(`/api/trials/${built.trialId}/pooled-report`))
      .body as PooledReport;
    expect(report.sitesIncluded.map((s) => s.fieldName)).toEqual([
      'North field',
      'River flat',
      'Ridge = top',
    ]);
    expect(report.sitesExcluded).toEqual([
      expect.objectContaining({ reason: 'incomplete: 8 of 16 strips have a yield' }),
    ]);
    expect(report.analysis!.rateTest.errorTerm).toBe('site:rate');
    expect(report.findings[0]).toMatch(
      /^3 sites were analysed together; 1 site was left out \(Late field: incomplete/,
    );
    const published = await coordinator.get(
      `/api/trials/${built.trialId}/pooled-report?sites=published`,
    );
    expect((published.body as PooledReport).sitesExcluded.map((e) => e.reason)).toContain(
      'site report not yet published',
    );
  });

  it('answers 403 to a member until the pooled report is published, then serves the snapshot', async () => {
    const member = await signIn(t.app, net.emails.member);
    const coordinator = await signIn(t.app, net.emails.coordinator);
    expect((await member.get(`/api/trials/${built.trialId}/pooled-report`)).status).toBe(403);
    expect((await coordinator.post(`/api/trials/${built.trialId}/publish`)).status).toBe(200);
    const res = await member.get(`/api/trials/${built.trialId}/pooled-report`);
    expect(res.status).toBe(200);
    const report = res.body as PooledReport;
    expect(report.fromSnapshot).toBe(true);
    expect(report.publicLinkToken).toBeNull();
    expect(report.sitesIncluded).toHaveLength(3);
    // Prices change on the frozen data, not on live data.
    const priced = (
      await member.get(`/api/trials/${built.trialId}/pooled-report?seedPrice=1&grainPrice=10`)
    ).body as PooledReport;
    expect(priced.prices).toEqual({ seedPricePerLb: 1, grainPricePerBu: 10 });
    expect(priced.analysis!.anova).toEqual(report.analysis!.anova);
  });

  it('flags the pooled report when a site’s data change after publishing', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    await t.dataSource.query('UPDATE sites SET data_version = data_version + 1 WHERE id = $1', [
      built.siteIds[3],
    ]);
    const report = (await coordinator.get(`/api/trials/${built.trialId}/pooled-report`))
      .body as PooledReport;
    expect(report.dataChangedSincePublished).toBe(true);
  });

  it('serves the public link only while it is on', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const anonymous = clientFor(t.app);
    const on = await coordinator.post(`/api/trials/${built.trialId}/public-link`, {
      enabled: true,
    });
    expect(on.status).toBe(200);
    const token = on.body.token as string;
    expect(token).toMatch(/^[A-Za-z0-9_-]{32}$/);
    const read = await anonymous.get(`/api/public/reports/${token}`);
    expect(read.status).toBe(200);
    expect((read.body as PooledReport).trial.id).toBe(built.trialId);
    expect(JSON.stringify(read.body)).not.toContain(net.emails.grower);

    const off = await coordinator.post(`/api/trials/${built.trialId}/public-link`, {
      enabled: false,
    });
    expect(off.body).toEqual({ token: null });
    expect((await anonymous.get(`/api/public/reports/${token}`)).status).toBe(404);
    expect(
      (await anonymous.get('/api/public/reports/not-a-real-token-at-all-xxxxxxxx')).status,
    ).toBe(404);
  });

  it('refuses a public link before the pooled report is published, and closes it on unpublish', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const on = await coordinator.post(`/api/trials/${built.trialId}/public-link`, {
      enabled: true,
    });
    const token = on.body.token as string;
    const unpublished = await coordinator.post(`/api/trials/${built.trialId}/unpublish`);
    expect(unpublished.status).toBe(200);
    expect((unpublished.body as PooledReport).published).toBeNull();
    expect((await clientFor(t.app).get(`/api/public/reports/${token}`)).status).toBe(404);
    const again = await coordinator.post(`/api/trials/${built.trialId}/public-link`, {
      enabled: true,
    });
    expect(again.status).toBe(409);
  });

  it('exports every strip with raw and derived columns and defused text cells', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const res = await coordinator.get(`/api/trials/${built.trialId}/export.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    const lines = res.text
      .replace(/^\uFEFF/, '')
      .trim()
      .split('\r\n');
    expect(lines).toHaveLength(1 + 4 * 16);
    const header = lines[0]!.split(',');
    expect(header).toEqual(
      expect.arrayContaining([
        'grain_weight_lb',
        'moisture_pct',
        'yield_bushels_per_acre',
        'return_over_seed_cost_per_acre',
      ]),
    );
    const ridge = lines.find((l) => l.includes('Ridge'))!;
    // A field name starting with "=" would not, but "Ridge = top" is harmless; check a formula-looking note.
    expect(ridge).toContain('Ridge = top');
    await t.dataSource.query(
      `UPDATE observations SET notes = '=HYPERLINK("http://x")' WHERE strip_id = $1`,
      [built.stripIds[0]![0]],
    );
    const again = await coordinator.get(`/api/trials/${built.trialId}/export.csv`);
    expect(again.text).toContain(`"'=HYPERLINK(""http://x"")"`);
    const member = await signIn(t.app, net.emails.member);
    expect((await member.get(`/api/trials/${built.trialId}/export.csv`)).status).toBe(403);
  });
});

describe('PDF export', () => {
  it('prints the site and the pooled report to PDFs that open', async () => {
    const net = await buildNetwork(t.dataSource, 'Pdf');
    const built = await buildReportTrial(t.dataSource, net, threeSites(net));
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'sheaf-pdf-'));
    for (const [url, name] of [
      [`/api/sites/${built.siteIds[0]}/report.pdf`, 'site.pdf'],
      [`/api/trials/${built.trialId}/pooled-report.pdf`, 'pooled.pdf'],
    ] as const) {
      const res = await coordinator.agent
        .get(url)
        .buffer(true)
        .parse((response, callback) => {
          const chunks: Buffer[] = [];
          response.on('data', (chunk: Buffer) => chunks.push(chunk));
          response.on('end', () => callback(null, Buffer.concat(chunks)));
        });
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('application/pdf');
      const file = path.join(dir, name);
      fs.writeFileSync(file, res.body as Buffer);
      const info = execFileSync('/usr/bin/pdfinfo', [file], { encoding: 'utf8' });
      const pages = Number(/Pages:\s+(\d+)/.exec(info)?.[1]);
      expect(pages).toBeGreaterThanOrEqual(2);
      expect(fs.statSync(file).size).toBeGreaterThan(20_000);
      // Plain words first: the grower's part names its intervals; F, df and the outlier test
      // come only under "For the statistician", below it.
      const text = execFileSync('/usr/bin/pdftotext', [file, '-'], { encoding: 'utf8' }).replace(
        /\s+/g,
        ' ',
      );
      const split = text.indexOf('For the statistician');
      expect(split, name).toBeGreaterThan(
        text.indexOf(name === 'site.pdf' ? 'What this site found' : 'What the network found'),
      );
      const grower = text.slice(0, split);
      expect(grower).toMatch(/95 % interval .* Dunnett-adjusted/);
      expect(grower).not.toMatch(/\bF = |\bdf\b|Bartlett|studentized/);
      expect(text.slice(split)).toMatch(/rate F = .* df/);
      expect(text.slice(split)).toMatch(name === 'site.pdf' ? /Outlier test/ : /Bartlett/);
    }
    fs.rmSync(dir, { recursive: true, force: true });
  });
});
