// Inputs that used to end in a 500 now get a 4xx naming the field or header, on every write
// route in the route table: NUL characters, lone surrogates, year-0000 dates, a latin1 JSON
// body, a Content-Encoding that does not match, truncated multipart, a NUL in an upload's file
// name, and e-mail addresses longer than mail servers take.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RouteEntry } from '../../../api/lib/route-table';
import { createTestApp, demoIds, signIn, type Client, type TestApp } from '../../helpers/app';

const WRITE_METHODS = new Set(['post', 'patch', 'put', 'delete']);
const isUpload = (route: RouteEntry) => /\/(import|photos)$/.test(route.path);

describe('bad input on every write route', () => {
  let t: TestApp;
  let grower: Client;
  let routes: RouteEntry[];
  let ids: Record<string, string>;

  beforeAll(async () => {
    t = await createTestApp();
    grower = await signIn(t.app, 'grower1@millbrook.example');
    routes = (await t.routes()).filter((r) => WRITE_METHODS.has(r.method));
    const demo = await demoIds(t.dataSource);
    const site = demo.sites.find((s) => s.email === 'grower1@millbrook.example')!;
    const [strip] = await t.dataSource.query('SELECT id FROM strips WHERE site_id = $1 LIMIT 1', [
      site.id,
    ]);
    const [network] = await t.dataSource.query('SELECT network_id FROM trials WHERE id = $1', [
      demo.oatTrialId,
    ]);
    ids = {
      trialId: demo.oatTrialId,
      siteId: site.id,
      stripId: strip.id,
      networkId: network.network_id,
    };
  });
  afterAll(() => t.close());

  const urlOf = (route: RouteEntry) =>
    route.path.replace(
      /:([A-Za-z]+)/g,
      (_m, name: string) => ids[name] ?? '00000000-0000-4000-8000-000000000000',
    );

  /** Sends a raw body with the grower's cookies and CSRF token. */
  async function sendRaw(
    route: RouteEntry,
    body: Buffer | string,
    headers: Record<string, string>,
  ) {
    const token = await grower.csrf();
    const req = grower.agent[route.method](urlOf(route)).set('X-CSRF-Token', token);
    for (const [name, value] of Object.entries(headers)) req.set(name, value);
    return req.send(body);
  }

  /** Every route whose answer is not a 4xx naming `field` (in `fields`). */
  async function failures(
    selected: RouteEntry[],
    send: (route: RouteEntry) => Promise<request.Response>,
    field: string,
  ): Promise<string[]> {
    const wrong: string[] = [];
    for (const route of selected) {
      const res = await send(route);
      const named = res.body?.error?.fields && field in res.body.error.fields;
      if (res.status < 400 || res.status >= 500 || !named)
        wrong.push(
          `${route.method} ${route.path}: ${res.status} ${JSON.stringify(res.body?.error?.fields)}`,
        );
    }
    return wrong;
  }

  const json = (value: unknown) => JSON.stringify(value);
  const jsonType = { 'Content-Type': 'application/json' };

  it('knows the write routes', () => {
    expect(routes.length).toBeGreaterThan(15);
    expect(routes.filter(isUpload)).toHaveLength(2);
  });

  it.each(['notes', 'name', 'label', 'soil', 'fieldName', 'caption'])(
    'answers 400 naming %s when it holds a NUL character',
    async (field) => {
      const wrong = await failures(
        routes.filter((r) => !isUpload(r)),
        (route) => sendRaw(route, json({ [field]: 'lodged\u0000patch' }), jsonType),
        field,
      );
      expect(wrong).toEqual([]);
    },
  );

  it('answers 400 naming the field for a lone surrogate, also inside nested objects', async () => {
    // Written as JSON escapes, as a client that cut an emoji in half would send it.
    const wrong = await failures(
      routes.filter((r) => !isUpload(r)),
      (route) => sendRaw(route, '{"values":{"notes":"half an emoji \\ud83c"}}', jsonType),
      'values.notes',
    );
    expect(wrong).toEqual([]);
  });

  it('answers 400 naming the field for a date in the year 0000', async () => {
    const wrong = await failures(
      routes.filter((r) => !isUpload(r)),
      (route) => sendRaw(route, json({ dates: { sowing: '0000-04-15' } }), jsonType),
      'dates.sowing',
    );
    expect(wrong).toEqual([]);
  });

  it('answers 415 naming Content-Type for a JSON body in latin1', async () => {
    const wrong = await failures(
      routes.filter((r) => !isUpload(r)),
      (route) =>
        sendRaw(route, Buffer.from('{"notes":"caf\xe9"}', 'latin1'), {
          'Content-Type': 'application/json; charset=latin1',
        }),
      'Content-Type',
    );
    expect(wrong).toEqual([]);
  });

  it('answers 415 naming Content-Encoding when a plain body claims to be gzip', async () => {
    const wrong = await failures(
      routes.filter((r) => !isUpload(r)),
      (route) =>
        sendRaw(route, json({ notes: 'plain' }), { ...jsonType, 'Content-Encoding': 'gzip' }),
      'Content-Encoding',
    );
    expect(wrong).toEqual([]);
  });

  it('answers 400 naming file for a truncated multipart upload', async () => {
    const boundary = 'sheafboundary1234';
    const truncated = Buffer.from(
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="strips.csv"\r\nContent-Type: text/csv\r\n\r\nsite,block,position\r\nField,1,`,
    );
    const wrong = await failures(
      routes.filter(isUpload),
      (route) =>
        sendRaw(route, truncated, { 'Content-Type': `multipart/form-data; boundary=${boundary}` }),
      'file',
    );
    expect(wrong).toEqual([]);
  });

  it('answers 400 naming file for a NUL in the uploaded file name', async () => {
    const boundary = 'sheafboundary5678';
    const body = Buffer.concat([
      Buffer.from(
        `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="photo\u0000.png"\r\nContent-Type: image/png\r\n\r\n`,
        'latin1',
      ),
      Buffer.from(
        '89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d4944415478da63f8cfc0f01f0005000201a5f3e3f00000000049454e44ae426082',
        'hex',
      ),
      Buffer.from(`\r\n--${boundary}--\r\n`),
    ]);
    const wrong = await failures(
      routes.filter(isUpload),
      (route) =>
        sendRaw(route, body, { 'Content-Type': `multipart/form-data; boundary=${boundary}` }),
      'file',
    );
    expect(wrong).toEqual([]);
  });

  it('answers 400 naming email for an address longer than mail servers take, and stores no invitation', async () => {
    // Source: RFC 5321 section 4.5.3.1 (local part at most 64 octets, path at most 256).
    const tooLong = `${'a'.repeat(65)}@example.com`;
    const coordinator = await signIn(t.app, 'coordinator@millbrook.example');
    const emailRoutes = [
      ['/api/auth/login', { email: tooLong, password: 'sheaf-demo' }],
      ['/api/auth/password-reset', { email: tooLong }],
      [`/api/networks/${ids.networkId}/invitations`, { email: tooLong, role: 'member' }],
      [
        `/api/networks/${ids.networkId}/invitations`,
        { email: `x@${'b'.repeat(250)}.example`, role: 'member' },
      ],
    ] as const;
    for (const [url, body] of emailRoutes) {
      const res = await coordinator.post(url, body);
      expect(res.status, url).toBe(400);
      expect(res.body.error.fields, url).toHaveProperty('email');
    }
    const rows = await t.dataSource.query(
      'SELECT count(*)::int AS n FROM invitations WHERE length(email) > 64',
    );
    expect(rows[0].n).toBe(0);
  });
});
