// Answers travel compressed to a browser that takes it: a grower's strips on a slow phone link are
// the wait before the site page shows.
import http from 'node:http';
import zlib from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../helpers/app';

/** A raw GET, so the test sees the bytes and headers exactly as the server sent them. */
function rawGet(url: string, headers: Record<string, string>) {
  return new Promise<{ headers: http.IncomingHttpHeaders; body: Buffer }>((resolve, reject) => {
    http
      .get(url, { headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => resolve({ headers: res.headers, body: Buffer.concat(chunks) }));
      })
      .on('error', reject);
  });
}

/** Signs in with plain requests and returns the session cookie header. */
async function sessionCookie(base: string, email: string): Promise<string> {
  const csrf = await fetch(`${base}/api/auth/csrf`);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const first = csrf.headers.getSetCookie().map((c) => c.split(';')[0]);
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: {
      'content-type': 'application/json',
      cookie: first.join('; '),
      'x-csrf-token': csrfToken,
    },
    body: JSON.stringify({ email, password: 'sheaf-demo' }),
  });
  const jar = new Map<string, string>();
  for (const pair of [...first, ...login.headers.getSetCookie().map((c) => c.split(';')[0]!)])
    jar.set(pair!.split('=')[0]!, pair!);
  return [...jar.values()].join('; ');
}

describe('compressed answers', () => {
  let t: TestApp;
  let cookie: string;
  let siteId: string;

  beforeAll(async () => {
    t = await createTestApp();
    cookie = await sessionCookie(t.app, 'grower1@millbrook.example');
    const mine = await (await fetch(`${t.app}/api/sites/mine`, { headers: { cookie } })).json();
    siteId = (Array.isArray(mine) ? mine : mine.items)[0].id;
  });
  afterAll(() => t.close());

  it("sends a site's strips gzip-compressed to a browser that takes gzip, and the same data", async () => {
    const url = `${t.app}/api/sites/${siteId}/strips`;
    const gzip = await rawGet(url, { cookie, 'accept-encoding': 'gzip' });
    const plain = await rawGet(url, { cookie });
    expect(gzip.headers['content-encoding']).toBe('gzip');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(JSON.parse(zlib.gunzipSync(gzip.body).toString('utf8'))).toEqual(
      JSON.parse(plain.body.toString('utf8')),
    );
    // Common practice, no published source: JSON of repeated keys shrinks to well under half.
    expect(gzip.body.length).toBeLessThan(plain.body.length / 2);
  });
});
