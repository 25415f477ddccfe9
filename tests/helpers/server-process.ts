// Starts the real server process (node --import tsx api/server.ts) against the test database.
import { spawn, type ChildProcess } from 'node:child_process';
import http from 'node:http';
import { testDatabaseUrl } from './app';

export function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const server = http.createServer();
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      server.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
    });
  });
}

export async function startServerProcess(
  port: number,
  env: Record<string, string> = {},
): Promise<ChildProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'api/server.ts'], {
    env: {
      ...process.env,
      NODE_ENV: 'test',
      PORT: String(port),
      HOST: '127.0.0.1',
      DATABASE_URL: testDatabaseUrl(),
      SESSION_SECRET: 'server-process-test-secret',
      SMTP_PORT: '0',
      RATE_LIMIT_LOGIN: '1000',
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error('server did not start')), 60_000);
    child.stdout!.on('data', (chunk: Buffer) => {
      if (chunk.toString().includes('listening on')) {
        clearTimeout(timer);
        resolve();
      }
    });
    child.on('exit', (code) => reject(new Error(`server exited early with ${code}`)));
  });
  return child;
}

export function exitOf(child: ChildProcess): Promise<number | null> {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) resolve(child.exitCode);
    else child.once('exit', (code) => resolve(code));
  });
}

/** Signs in over plain HTTP and returns the cookie and CSRF token to send. */
export async function signInOverHttp(base: string, email: string, password = 'sheaf-demo') {
  const csrfRes = await fetch(`${base}/api/auth/csrf`);
  const csrfCookie = csrfRes.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', cookie: csrfCookie, 'x-csrf-token': csrfToken },
    body: JSON.stringify({ email, password }),
  });
  if (login.status !== 200) throw new Error(`sign-in failed: ${login.status}`);
  const cookie = login.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  // The token changes at sign-in: use the one the sign-in answer carries.
  return { cookie, 'x-csrf-token': login.headers.get('x-csrf-token') ?? csrfToken };
}
