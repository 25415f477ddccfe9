import fs from 'node:fs';
import Papa from 'papaparse';
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
  type CollectSite,
} from '../strips/collect-builders';

const fixture = (name: string) => fs.readFileSync(`fixtures/imports/${name}`);

describe('CSV import: GET /api/sites/:siteId/import-template.csv and POST /api/sites/:siteId/import', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let site: CollectSite;
  let grower: Client;

  // supertest requests are thenables, so the CSRF token is fetched first and the request built after.
  const upload = async (
    client: Client,
    siteId: string,
    body: Buffer,
    filename = 'strips.csv',
    contentType = 'text/csv',
  ) => {
    const token = await client.csrf();
    return client.agent
      .post(`/api/sites/${siteId}/import`)
      .set('X-CSRF-Token', token)
      .attach('file', body, { filename, contentType });
  };
  const versions = async (siteId: string) =>
    (
      await t.dataSource.query(
        'SELECT version FROM strips WHERE site_id = $1 ORDER BY block, position',
        [siteId],
      )
    ).map((r: { version: number }) => r.version);
  const observationCount = async (siteId: string) =>
    Number(
      (
        await t.dataSource.query(
          'SELECT count(*) FROM observations o JOIN strips s ON s.id = o.strip_id WHERE s.site_id = $1',
          [siteId],
        )
      )[0].count,
    );

  beforeAll(async () => {
    ({ t, net, site, grower } = await openCollectSite('Imports', { fieldName: 'Fixture field' }));
  });
  afterAll(() => t.close());

  it('writes nothing and names the row and column when one row is bad', async () => {
    const before = await dataVersion(t.dataSource, site.siteId);
    const res = await upload(grower, site.siteId, fixture('bad-one-row.csv'));
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('invalid_rows');
    expect(res.body.error.message).toMatch(/nothing was saved/);
    expect(res.body.error.rows).toEqual([
      { row: 3, column: 'moisture_pct', message: expect.stringMatching(/^Enter a number/) },
    ]);
    expect(await observationCount(site.siteId)).toBe(0);
    expect(await versions(site.siteId)).toEqual([1, 1, 1, 1, 1, 1]);
    expect(await dataVersion(t.dataSource, site.siteId)).toBe(before);
  });

  it('reports an unknown column instead of ignoring it', async () => {
    const res = await upload(grower, site.siteId, fixture('unknown-column.csv'));
    expect(res.status).toBe(422);
    expect(res.body.error.rows).toEqual([
      { row: 1, column: 'yield_bu', message: expect.stringMatching(/Unknown column/) },
    ]);
  });

  it('writes a good file in one go and bumps each changed strip and the site data_version once', async () => {
    const before = await dataVersion(t.dataSource, site.siteId);
    const res = await upload(grower, site.siteId, fixture('good-site.csv'));
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      rows: 6,
      changedStrips: 6,
      unchangedStrips: 0,
      dataVersion: before + 1,
    });
    expect(await versions(site.siteId)).toEqual([2, 2, 2, 2, 2, 2]);
    const list = await grower.get(`/api/sites/${site.siteId}/strips`);
    const first = list.body.strips[0];
    expect(first.values).toMatchObject({
      standCounts: [44, 47, 45],
      standRowLength: 3,
      grainWeight: 7.4,
      harvestRows: 4,
      harvestLength: 50,
      moisturePct: 13.2,
    });
    expect(first.recorded).toEqual({ stand: true, tillers: false, heads: false, yield: true });
    const events = await t.dataSource.query(
      `SELECT count(*) FROM audit_events WHERE site_id = $1 AND action = 'import'`,
      [site.siteId],
    );
    expect(Number(events[0].count)).toBe(6);
  });

  it('changes nothing when the same file is uploaded twice', async () => {
    const before = await dataVersion(t.dataSource, site.siteId);
    const res = await upload(grower, site.siteId, fixture('good-site.csv'));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ changedStrips: 0, unchangedStrips: 6, dataVersion: before });
    expect(await versions(site.siteId)).toEqual([2, 2, 2, 2, 2, 2]);
    expect(await dataVersion(t.dataSource, site.siteId)).toBe(before);
  });

  it('stores formula-like and HTML values as plain text', async () => {
    const rows = await t.dataSource.query(
      'SELECT s.block, s.position, o.notes FROM observations o JOIN strips s ON s.id = o.strip_id WHERE s.site_id = $1 ORDER BY s.block, s.position',
      [site.siteId],
    );
    expect(rows[1].notes).toBe(`=cmd|' /C calc'!A0`);
    expect(rows[3].notes).toBe(`<script>alert('x')</script> lodged after storm`);
  });

  it('offers a template prefilled with site, plot, block, position and rate, guarding formula-like cells', async () => {
    const res = await grower.get(`/api/sites/${site.siteId}/import-template.csv`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(
      /attachment; filename="sheaf-fixture-field-strips\.csv"/,
    );
    const parsed = Papa.parse<string[]>(res.text.replace(/^\uFEFF/, ''), { skipEmptyLines: true });
    const [header, ...rows] = parsed.data;
    expect(header!.slice(0, 7)).toEqual([
      'site',
      'plot',
      'block',
      'position',
      'rate',
      'seeds_sown',
      'stand_1',
    ]);
    expect(header).toContain('grain_weight_lb');
    expect(header).toContain('moisture_pct');
    expect(rows).toHaveLength(6);
    // Common practice, no published source: field trials number plots block × 100 + position.
    expect(rows.map((r) => r.slice(0, 5).join(','))).toEqual(
      site.strips.map(
        (s) => `Fixture field,${s.block * 100 + s.position},${s.block},${s.position},${s.label}`,
      ),
    );
    const notes = header!.indexOf('notes');
    // A spreadsheet would run a cell starting with "="; the template guards it with an apostrophe.
    expect(rows[1]![notes]).toBe(`'=cmd|' /C calc'!A0`);
  });

  it('round-trips the exported template without changing anything', async () => {
    const template = await grower.get(`/api/sites/${site.siteId}/import-template.csv`);
    const before = await versions(site.siteId);
    const res = await upload(grower, site.siteId, Buffer.from(template.text, 'utf8'));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ rows: 6, changedStrips: 0, unchangedStrips: 6 });
    expect(await versions(site.siteId)).toEqual(before);
  });

  it('exports the same columns as the template, and the export imports back changing nothing', async () => {
    const template = await grower.get(`/api/sites/${site.siteId}/import-template.csv`);
    const exported = await grower.get(`/api/sites/${site.siteId}/export.csv`);
    expect(exported.status).toBe(200);
    expect(exported.headers['content-disposition']).toMatch(/sheaf-fixture-field-export\.csv/);
    const headerOf = (text: string) => text.replace(/^\uFEFF/, '').split('\r\n')[0];
    expect(headerOf(exported.text)).toBe(headerOf(template.text));
    // Stored values come back out: the first strip's stand counts sit in stand_1…stand_3.
    const [header, first] = Papa.parse<string[]>(exported.text.replace(/^\uFEFF/, ''), {
      skipEmptyLines: true,
    }).data;
    expect(first![header!.indexOf('stand_2')]).toBe('47');
    const before = await versions(site.siteId);
    const dataBefore = await dataVersion(t.dataSource, site.siteId);
    const res = await upload(grower, site.siteId, Buffer.from(exported.text, 'utf8'));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ rows: 6, changedStrips: 0, unchangedStrips: 6 });
    expect(await versions(site.siteId)).toEqual(before);
    expect(await dataVersion(t.dataSource, site.siteId)).toBe(dataBefore);
  });

  it('imports a semicolon-separated file with decimal commas, found by plot number alone', async () => {
    const [strip] = site.strips;
    const plot = strip!.block * 100 + strip!.position;
    const csv = `site;plot;moisture_pct;grain_weight_lb\r\nFixture field;${plot};12,5;7,25\r\n`;
    const res = await upload(grower, site.siteId, Buffer.from(csv, 'utf8'));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ rows: 1, changedStrips: 1 });
    const list = await grower.get(`/api/sites/${site.siteId}/strips`);
    const stored = list.body.strips.find((s: { stripId: string }) => s.stripId === strip!.id);
    expect(stored.values).toMatchObject({ moisturePct: 12.5, grainWeight: 7.25 });
    expect(stored.plotNumber).toBe(plot);
  });

  it('refuses a thousands separator and letters with the same words as the forms', async () => {
    const csv = 'site;block;position;seeds_sown;moisture_pct\r\nFixture field;1;1;1.234,5;x\r\n';
    const res = await upload(grower, site.siteId, Buffer.from(csv, 'utf8'));
    expect(res.status).toBe(422);
    expect(res.body.error.rows).toEqual([
      {
        row: 2,
        column: 'seeds_sown',
        message: expect.stringMatching(/^Write 1234 or 1234\.5, without thousands separators/),
      },
      { row: 2, column: 'moisture_pct', message: expect.stringMatching(/^Enter a number/) },
    ]);
  });

  it('names the plot column when the plot and the block and position disagree', async () => {
    const csv = 'site,plot,block,position\r\nFixture field,102,2,1\r\n';
    const res = await upload(grower, site.siteId, Buffer.from(csv, 'utf8'));
    expect(res.status).toBe(422);
    expect(res.body.error.rows).toEqual([
      {
        row: 2,
        column: 'plot',
        message: expect.stringMatching(/^Plot 102 is block 1, position 2/),
      },
    ]);
  });

  it('answers 415 for a file that is not CSV by its content, whatever its name', async () => {
    const png = Buffer.from(
      '89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a5f3e3f00000000049454e44ae426082',
      'hex',
    );
    const res = await upload(grower, site.siteId, png, 'strips.csv', 'text/csv');
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_media_type');
    const zip = Buffer.concat([Buffer.from('504b0304', 'hex'), Buffer.alloc(200)]);
    expect(
      (
        await upload(
          grower,
          site.siteId,
          zip,
          'strips.xlsx',
          'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
        )
      ).status,
    ).toBe(415);
  });

  it('refuses a file over 5 MB with 413', async () => {
    const big = Buffer.alloc(5 * 1024 * 1024 + 10, 'a');
    const res = await upload(grower, site.siteId, big);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
  });

  it('answers 400 when no file is sent', async () => {
    const res = await grower.agent
      .post(`/api/sites/${site.siteId}/import`)
      .set('X-CSRF-Token', await grower.csrf())
      .field('note', 'x');
    expect(res.status).toBe(400);
  });

  it('refuses imports to another grower’s site and from members', async () => {
    const grower2 = await signIn(t.app, net.emails.grower2);
    expect((await upload(grower2, site.siteId, fixture('good-site.csv'))).status).toBe(403);
    expect((await grower2.get(`/api/sites/${site.siteId}/import-template.csv`)).status).toBe(403);
    const member = await signIn(t.app, net.emails.member);
    expect((await upload(member, site.siteId, fixture('good-site.csv'))).status).toBe(403);
  });

  it('answers 423 once the site report is published', async () => {
    const net2 = await buildNetwork(t.dataSource, 'Imports locked');
    const locked = await buildCollectSite(t.dataSource, net2, { fieldName: 'Fixture field' });
    await publishSite(t.dataSource, locked.siteId);
    const owner = await signIn(t.app, net2.emails.grower);
    const res = await upload(owner, locked.siteId, fixture('good-site.csv'));
    expect(res.status).toBe(423);
    expect(await observationCount(locked.siteId)).toBe(0);
  });
});
