import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import yauzl from 'yauzl';
import {
  buildNetwork,
  createTestApp,
  signIn,
  type BuiltNetwork,
  type TestApp,
} from '../../helpers/app';
import { buildReportTrial, rcbdStrips } from '../reports/build-report-trial';

/** Every file of a zip, by name, as text. */
async function unzip(buffer: Buffer): Promise<Map<string, string>> {
  const zip = await new Promise<yauzl.ZipFile>((resolve, reject) =>
    yauzl.fromBuffer(buffer, { lazyEntries: false }, (err, file) =>
      err ? reject(err) : resolve(file),
    ),
  );
  const files = new Map<string, string>();
  await new Promise<void>((resolve, reject) => {
    zip.on('entry', (entry: yauzl.Entry) => {
      zip.openReadStream(entry, (err, stream) => {
        if (err || !stream) return reject(err);
        const chunks: Buffer[] = [];
        stream.on('data', (c: Buffer) => chunks.push(c));
        stream.on('end', () => files.set(entry.fileName, Buffer.concat(chunks).toString('utf8')));
      });
    });
    zip.on('end', () => setTimeout(resolve, 50));
    zip.on('error', reject);
  });
  return files;
}

function binaryParser(
  res: NodeJS.ReadableStream,
  callback: (err: Error | null, body: unknown) => void,
) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => callback(null, Buffer.concat(chunks)));
}

describe('GET /api/trials/:trialId/archive.zip', () => {
  let t: TestApp;
  let net: BuiltNetwork;
  let other: BuiltNetwork;
  let trialId: string;

  beforeAll(async () => {
    t = await createTestApp();
    net = await buildNetwork(t.dataSource, 'Archive');
    other = await buildNetwork(t.dataSource, 'Archive other');
    const yields = [
      [40, 52, 58, 60],
      [42, 50, 57, null],
      [39, 53, 59, 58],
      [41, 51, 60, 62],
    ];
    const built = await buildReportTrial(t.dataSource, net, {
      name: 'Archive oats',
      sites: [
        {
          fieldName: 'Creek, "lower" field',
          growerUserId: net.userIds.grower,
          strips: rcbdStrips(yields),
        },
        { fieldName: '=cmd|calc', growerUserId: net.userIds.grower2, strips: rcbdStrips(yields) },
      ],
    });
    trialId = built.trialId;
    await t.dataSource.query(
      `INSERT INTO attachments (site_id, strip_id, stored_name, original_name, mime_type, size_bytes, caption, uploaded_by)
       VALUES ($1, $2, 'archive-test.jpg', 'lodging.jpg', 'image/jpeg', 2048, 'Lodging after rain', $3)`,
      [built.siteIds[0], built.stripIds[0]![0], net.userIds.grower],
    );
  });
  afterAll(() => t.close());

  it('gives the coordinator one zip with a README describing every file', async () => {
    const coordinator = await signIn(t.app, net.emails.coordinator);
    const res = await coordinator.agent
      .get(`/api/trials/${trialId}/archive.zip`)
      .buffer(true)
      .parse(binaryParser as never);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/zip');
    expect(res.headers['content-disposition']).toMatch(/archive-oats-archive\.zip/);
    const files = await unzip(res.body as Buffer);
    expect([...files.keys()].sort()).toEqual([
      'README.txt',
      'audit.csv',
      'layout.csv',
      'observations.csv',
      'photos.csv',
      'sites.csv',
      'trial.json',
    ]);
    const readme = files.get('README.txt')!;
    for (const name of files.keys()) if (name !== 'README.txt') expect(readme).toContain(name);

    const design = JSON.parse(files.get('trial.json')!);
    expect(design).toMatchObject({ name: 'Archive oats', referenceRate: 100, blocksPerSite: 4 });
    expect(design.rateLevels).toHaveLength(4);

    const observations = files.get('observations.csv')!.trim().split('\r\n');
    // Header + 2 sites × 4 blocks × 4 rates.
    expect(observations).toHaveLength(1 + 32);
    expect(observations[0]).toContain('grain_weight_lb');
    const layout = files.get('layout.csv')!.trim().split('\r\n');
    expect(layout).toHaveLength(1 + 32);

    const sites = files.get('sites.csv')!;
    // Common practice, no published source: RFC 4180 quoting and formula defusing.
    expect(sites).toContain('"Creek, ""lower"" field"');
    expect(sites).toContain("'=cmd|calc");
    expect(sites).toContain('Farm A');
    expect(files.get('photos.csv')).toContain('Lodging after rain');
    expect(files.get('photos.csv')).not.toContain('archive-test.jpg');
  });

  it('refuses growers with 403 and another network with 404', async () => {
    const grower = await signIn(t.app, net.emails.grower);
    expect((await grower.get(`/api/trials/${trialId}/archive.zip`)).status).toBe(403);
    const outsider = await signIn(t.app, other.emails.coordinator);
    expect((await outsider.get(`/api/trials/${trialId}/archive.zip`)).status).toBe(404);
  });
});
