// The real server process: SIGTERM lets an in-flight request finish, and a signed-in
// session still works after the server restarts.
import type { ChildProcess } from 'node:child_process';
import http from 'node:http';
import { afterEach, describe, expect, it } from 'vitest';
import { exitOf, freePort, startServerProcess as startServer } from '../helpers/server-process';

interface Reply {
  status: number;
  body: string;
  cookies: string[];
}
function send(
  port: number,
  method: string,
  path: string,
  headers: Record<string, string>,
  body?: string,
): Promise<Reply> {
  return new Promise((resolve, reject) => {
    const req = http.request({ host: '127.0.0.1', port, method, path, headers }, (res) => {
      let data = '';
      res.on('data', (c) => (data += c));
      res.on('end', () =>
        resolve({
          status: res.statusCode ?? 0,
          body: data,
          cookies: (res.headers['set-cookie'] ?? []).map((c) => c.split(';')[0]!),
        }),
      );
    });
    req.on('error', reject);
    req.end(body);
  });
}

describe('the server process', () => {
  let child: ChildProcess | null = null;
  afterEach(() => {
    if (child && child.exitCode === null) child.kill('SIGKILL');
  });

  it('finishes an in-flight request on SIGTERM, then exits 0', async () => {
    const port = await freePort();
    child = await startServer(port);
    const csrf = await send(port, 'GET', '/api/auth/csrf', {});
    const cookie = csrf.cookies.join('; ');
    const token = JSON.parse(csrf.body).csrfToken as string;
    const body = JSON.stringify({ email: 'coordinator@millbrook.example', password: 'sheaf-demo' });

    // Send half the body, signal the server, then send the rest.
    const reply = new Promise<Reply>((resolve, reject) => {
      const req = http.request(
        {
          host: '127.0.0.1',
          port,
          method: 'POST',
          path: '/api/auth/login',
          headers: {
            'Content-Type': 'application/json',
            'Content-Length': String(Buffer.byteLength(body)),
            Cookie: cookie,
            'X-CSRF-Token': token,
          },
        },
        (res) => {
          let data = '';
          res.on('data', (c) => (data += c));
          res.on('end', () => resolve({ status: res.statusCode ?? 0, body: data, cookies: [] }));
        },
      );
      req.on('error', reject);
      req.write(body.slice(0, 20));
      setTimeout(() => {
        child!.kill('SIGTERM');
        setTimeout(() => req.end(body.slice(20)), 400);
      }, 200);
    });
    const result = await reply;
    expect(result.status).toBe(200);
    expect(JSON.parse(result.body).email).toBe('coordinator@millbrook.example');
    expect(await exitOf(child)).toBe(0);
  });

  it('keeps people signed in across a restart of the server process', async () => {
    const port = await freePort();
    child = await startServer(port);
    const csrf = await send(port, 'GET', '/api/auth/csrf', {});
    const token = JSON.parse(csrf.body).csrfToken as string;
    const login = await send(
      port,
      'POST',
      '/api/auth/login',
      {
        'Content-Type': 'application/json',
        Cookie: csrf.cookies.join('; '),
        'X-CSRF-Token': token,
      },
      JSON.stringify({ email: 'grower2@millbrook.example', password: 'sheaf-demo' }),
    );
    expect(login.status).toBe(200);
    const sessionCookie = login.cookies.join('; ');
    child.kill('SIGTERM');
    expect(await exitOf(child)).toBe(0);

    child = await startServer(port);
    const me = await send(port, 'GET', '/api/auth/me', { Cookie: sessionCookie });
    expect(me.status).toBe(200);
    expect(JSON.parse(me.body).email).toBe('grower2@millbrook.example');
    child.kill('SIGTERM');
    expect(await exitOf(child)).toBe(0);
  });
});
