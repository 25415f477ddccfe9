import fs from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';
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
  openCollectSite,
  publishSite,
  type CollectSite,
} from '../strips/collect-builders';

// A 1 × 1 PNG (the smallest valid file) and a small real JPEG: image bytes for the content check.
const PNG = Buffer.from(
  '89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a5f3e3f00000000049454e44ae426082',
  'hex',
);
let JPEG: Buffer;

describe('photos: POST /api/sites/:siteId/photos, GET /api/sites/:siteId/photos, GET /api/photos/:photoId', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let site: CollectSite;
  let grower: Client;

  const upload = async (
    client: Client,
    siteId: string,
    body: Buffer,
    filename: string,
    fields: Record<string, string> = {},
  ) => {
    const request = client.agent
      .post(`/api/sites/${siteId}/photos`)
      .set('X-CSRF-Token', await client.csrf());
    for (const [key, value] of Object.entries(fields)) request.field(key, value);
    return request.attach('file', body, { filename, contentType: 'image/jpeg' });
  };

  beforeAll(async () => {
    JPEG = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#6a8f3c' } })
      .jpeg()
      .toBuffer();
    ({ t, net, site, grower } = await openCollectSite('Photos'));
  });
  afterAll(() => t.close());

  it('stores a PNG for a strip under a generated name and serves it with its type and nosniff', async () => {
    const res = await upload(grower, site.siteId, PNG, '../../etc/passwd.png', {
      stripId: site.strips[0]!.id,
      caption: '<b>lodging</b> in block 1',
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      siteId: site.siteId,
      stripId: site.strips[0]!.id,
      mimeType: 'image/png',
      caption: '<b>lodging</b> in block 1',
    });
    const [row] = await t.dataSource.query('SELECT stored_name FROM attachments WHERE id = $1', [
      res.body.id,
    ]);
    expect(row.stored_name).toMatch(/^[0-9a-f-]{36}\.png$/);
    expect(fs.existsSync(path.join(path.resolve(t.config.UPLOAD_DIR), row.stored_name))).toBe(true);
    const file = await grower.get(res.body.url).buffer(true);
    expect(file.status).toBe(200);
    expect(file.headers['content-type']).toBe('image/png');
    expect(file.headers['x-content-type-options']).toBe('nosniff');
    // Stored re-encoded (without metadata): the same pixels, not necessarily the same bytes.
    expect(Number(file.headers['content-length'])).toBe(res.body.sizeBytes);
    const [sent, served] = await Promise.all(
      [PNG, file.body as Buffer].map((b) =>
        sharp(b, { failOn: 'none' }).ensureAlpha().raw().toBuffer(),
      ),
    );
    expect(Buffer.compare(served!, sent!)).toBe(0);
  });

  it('accepts a JPEG and lists photos per site and per strip', async () => {
    const res = await upload(grower, site.siteId, JPEG, 'IMG_0001.JPG');
    expect(res.status).toBe(201);
    expect(res.body.mimeType).toBe('image/jpeg');
    const all = await grower.get(`/api/sites/${site.siteId}/photos`);
    expect(all.body).toHaveLength(2);
    const strip = await grower.get(
      `/api/sites/${site.siteId}/photos?stripId=${site.strips[0]!.id}`,
    );
    expect(strip.body).toHaveLength(1);
  });

  it('refuses a file that only claims to be a photo with 415', async () => {
    const res = await upload(
      grower,
      site.siteId,
      Buffer.from('<svg onload="alert(1)"></svg>'),
      'photo.jpg',
    );
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_media_type');
  });

  it('refuses a photo over 8 MB with 413', async () => {
    const big = Buffer.concat([JPEG, Buffer.alloc(8 * 1024 * 1024)]);
    expect((await upload(grower, site.siteId, big, 'big.jpg')).status).toBe(413);
  });

  it('refuses a strip of another site', async () => {
    const other = await t.dataSource.query('SELECT id FROM strips WHERE site_id = $1 LIMIT 1', [
      site.otherSiteId,
    ]);
    expect((await upload(grower, site.siteId, PNG, 'a.png', { stripId: other[0].id })).status).toBe(
      400,
    );
  });

  it('keeps photos from other growers, members before publishing, and other networks', async () => {
    const [photo] = await t.dataSource.query(
      'SELECT id FROM attachments WHERE site_id = $1 LIMIT 1',
      [site.siteId],
    );
    const grower2 = await signIn(t.app, net.emails.grower2);
    expect((await grower2.get(`/api/photos/${photo.id}`)).status).toBe(403);
    expect((await upload(grower2, site.siteId, PNG, 'a.png')).status).toBe(403);
    const member = await signIn(t.app, net.emails.member);
    expect((await member.get(`/api/photos/${photo.id}`)).status).toBe(403);
    const outsider = await signIn(
      t.app,
      (await buildNetwork(t.dataSource, 'Photos other')).emails.coordinator,
    );
    expect((await outsider.get(`/api/photos/${photo.id}`)).status).toBe(404);
    const coordinator = await signIn(t.app, net.emails.coordinator);
    expect((await coordinator.get(`/api/photos/${photo.id}`)).status).toBe(200);
  });

  it('refuses new photos once the site report is published', async () => {
    const net2 = await buildNetwork(t.dataSource, 'Photos locked');
    const locked = await buildCollectSite(t.dataSource, net2);
    await publishSite(t.dataSource, locked.siteId);
    const owner = await signIn(t.app, net2.emails.grower);
    expect((await upload(owner, locked.siteId, PNG, 'a.png')).status).toBe(423);
  });
});
