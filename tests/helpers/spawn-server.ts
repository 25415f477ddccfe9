// Starts Sheaf's real processes for tests: the API server (two cluster workers by default) and
// the mail catcher. Plain Node, no vitest imports, so the global setup can use it too.
import { spawn, type ChildProcess } from 'node:child_process';
import http from 'node:http';

export function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const server = http.createServer();
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      server.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
    });
  });
}

export interface Spawned {
  child: ChildProcess;
  /** Everything the process printed on stdout and stderr so far. */
  output(): string;
  stop(): Promise<void>;
}

/** Spawns a TypeScript entry point and resolves once a line matching `ready` is printed. */
export function spawnUntil(
  entry: string,
  env: Record<string, string>,
  ready: RegExp,
  timeoutMs = 60_000,
): Promise<Spawned & { match: RegExpMatchArray }> {
  const child = spawn(process.execPath, ['--import', 'tsx', entry], {
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const spawned: Spawned = {
    child,
    output: () => output,
    stop: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null || child.signalCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
      }),
  };
  return new Promise((resolve, reject) => {
    const timer = setTimeout(
      () => reject(new Error(`${entry} did not start in time:\n${output}`)),
      timeoutMs,
    );
    const onData = (chunk: Buffer) => {
      output += chunk.toString();
      const match = output.match(ready);
      if (match) {
        clearTimeout(timer);
        resolve({ ...spawned, match });
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`${entry} exited early with ${code}:\n${output}`));
    });
  });
}

export interface CatcherProcess extends Spawned {
  smtpPort: number;
  url: string;
}

export async function startCatcherProcess(): Promise<CatcherProcess> {
  const started = await spawnUntil(
    'api/mail/catcher-process.ts',
    { NODE_ENV: 'test', SMTP_PORT: '0', MAIL_CATCHER_HTTP_PORT: '0' },
    /ready: smtp:\/\/127\.0\.0\.1:(\d+) (http:\/\/127\.0\.0\.1:\d+)/,
  );
  return { ...started, smtpPort: Number(started.match[1]), url: started.match[2]! };
}

/** The environment of a test API server; `env` overrides any of it. */
export function serverEnv(
  base: { databaseUrl: string; catcher: CatcherProcess; port: number },
  env: Record<string, string> = {},
): Record<string, string> {
  return {
    NODE_ENV: 'test',
    HOST: '127.0.0.1',
    PORT: String(base.port),
    DATABASE_URL: base.databaseUrl,
    SESSION_SECRET: 'test-session-secret-of-enough-length',
    PUBLIC_URL: 'http://sheaf.test',
    SMTP_PORT: String(base.catcher.smtpPort),
    MAIL_CATCHER_URL: base.catcher.url,
    RATE_LIMIT_LOGIN: '1000',
    RATE_LIMIT_INVITES: '1000',
    UPLOAD_DIR: `.data/test-uploads-${process.pid}`,
    WEB_DIST: process.env.WEB_DIST ?? 'dist/web',
    WEB_CONCURRENCY: '2',
    // The lowest bcrypt cost: tests sign in hundreds of times, and the hash format is the same.
    BCRYPT_COST: process.env.BCRYPT_COST ?? '4',
    ...env,
  };
}

/** Starts the API server (a cluster primary with its workers) and waits until all listen. */
export function startApiServer(env: Record<string, string>) {
  return spawnUntil('api/server.ts', env, /listening on http:\/\/[^\s]+/);
}

/** The pg warning printed when two queries overlap on one connection (an error in pg 9). */
export const OVERLAPPING_QUERY_WARNING = /already executing a query/;
