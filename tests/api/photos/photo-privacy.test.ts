// Stored photos carry no location or camera metadata but stay upright, pages get small
// previews, and a disk that fills up during an upload leaves no file behind (507).
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildNetwork, createTestApp, signIn, type Client, type TestApp } from '../../helpers/app';
import { buildCollectSite, openCollectSite, type CollectSite } from '../strips/collect-builders';

/** A JPEG as a phone writes it: turned by an EXIF orientation tag, with a GPS position. */
async function phonePhoto(width: number, height: number): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 3, background: '#b08a3e' } })
    .jpeg()
    .withExif({
      IFD0: { Make: 'InventedCam', Model: 'Field 1' },
      IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '45/1 30/1 0/1', GPSMapDatum: 'WGS-84' },
    })
    .withMetadata({ orientation: 6 })
    .toBuffer();
}

async function upload(client: Client, siteId: string, body: Buffer) {
  const token = await client.csrf();
  return client.agent
    .post(`/api/sites/${siteId}/photos`)
    .set('X-CSRF-Token', token)
    .attach('file', body, { filename: 'IMG_2041.JPG', contentType: 'image/jpeg' });
}

describe('photo metadata and previews', () => {
  let t: TestApp;
  let site: CollectSite;
  let grower: Client;
  beforeAll(async () => {
    ({ t, site, grower } = await openCollectSite('Photo privacy'));
  });
  afterAll(() => t.close());

  it('stores the photo upright with no GPS position or camera tags', async () => {
    const original = await phonePhoto(80, 40);
    const before = await sharp(original).metadata();
    expect(before.orientation).toBe(6);
    expect(original.includes('WGS-84')).toBe(true);

    const res = await upload(grower, site.siteId, original);
    expect(res.status).toBe(201);
    const stored = (await grower.get(res.body.url).buffer(true)).body as Buffer;
    const after = await sharp(stored).metadata();
    expect(after.exif).toBeUndefined();
    expect(after.orientation).toBeUndefined();
    expect(stored.includes('WGS-84')).toBe(false);
    expect(stored.includes('InventedCam')).toBe(false);
    // Orientation 6 means "turn 90° clockwise to view" (EXIF 2.32, tag 0x0112): 80 × 40 → 40 × 80.
    // Source: CIPA DC-008-2019 (EXIF 2.32), Orientation tag, value 6.
    expect([after.width, after.height]).toEqual([40, 80]);
  });

  it('serves a preview of at most 400 px that the photo list points to', async () => {
    const res = await upload(grower, site.siteId, await phonePhoto(2000, 1500));
    expect(res.status).toBe(201);
    expect(res.body.thumbnailUrl).toBe(`${res.body.url}?size=thumbnail`);
    const preview = await grower.get(res.body.thumbnailUrl).buffer(true);
    expect(preview.status).toBe(200);
    expect(preview.headers['content-type']).toBe('image/jpeg');
    const meta = await sharp(preview.body as Buffer).metadata();
    expect([meta.width, meta.height]).toEqual([300, 400]);
    expect(meta.exif).toBeUndefined();
    expect((preview.body as Buffer).length).toBeLessThan(res.body.sizeBytes);
  });
});

describe('photo upload on a full disk', () => {
  const mountPoint = fs.mkdtempSync(path.join(os.tmpdir(), 'sheaf-full-disk-'));
  let mounted = false;
  let t: TestApp;
  beforeAll(async () => {
    try {
      // A 64 kB file system: the photo below does not fit. Needs root (the test machine is).
      execFileSync('mount', ['-t', 'tmpfs', '-o', 'size=64k', 'tmpfs', mountPoint]);
      mounted = true;
    } catch {
      mounted = false;
    }
    t = await createTestApp({ UPLOAD_DIR: mountPoint });
  });
  afterAll(async () => {
    await t.close();
    if (mounted) execFileSync('umount', [mountPoint]);
    fs.rmSync(mountPoint, { recursive: true, force: true });
  });

  it('answers 507 and leaves no file when the disk fills up', async (context) => {
    if (!mounted) context.skip();
    const net = await buildNetwork(t.dataSource, 'Full disk');
    const { siteId } = await buildCollectSite(t.dataSource, net);
    const owner = await signIn(t.app, net.emails.grower);
    // Random pixels do not compress: about 200 kB as JPEG.
    const noise = await sharp(
      Buffer.from(Array.from({ length: 300 * 300 * 3 }, () => Math.floor(Math.random() * 256))),
      {
        raw: { width: 300, height: 300, channels: 3 },
      },
    )
      .jpeg({ quality: 95 })
      .toBuffer();
    expect(noise.length).toBeGreaterThan(64 * 1024);
    const res = await upload(owner, siteId, noise);
    expect(res.status).toBe(507);
    expect(res.body.error.code).toBe('insufficient_storage');
    expect(res.body.error.message).toMatch(/no room/);
    expect(fs.readdirSync(mountPoint)).toEqual([]);
    const rows = await t.dataSource.query(
      'SELECT count(*)::int AS n FROM attachments WHERE site_id = $1',
      [siteId],
    );
    expect(rows[0].n).toBe(0);
  });
});
