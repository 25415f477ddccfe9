// The bench's world: a throw-away PostgreSQL with the demo and an invented 200-site trial, and
// the real server (api/server.ts) started with WEB_CONCURRENCY workers, signed in as the coordinator.
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { DATA_DIR, runTs } from '../lib/env.mjs';
import { freePort, startCluster } from '../lib/postgres.mjs';

/** Starts the cluster, migrates, loads the demo and the bench trial; returns its ids and stop(). */
export async function startDatabase() {
  const dataDir = path.join(DATA_DIR, `bench-pg-${process.pid}`);
  const cluster = await startCluster({
    dataDir,
    port: await freePort(),
    database: 'sheaf_bench',
    throwAway: true,
  });
  const stop = () => {
    cluster.stop();
    fs.rmSync(cluster.dataDir, { recursive: true, force: true });
    // A cluster moved to the temporary folder leaves an empty folder behind: remove it too.
    if (path.basename(path.dirname(cluster.dataDir)).startsWith('sheaf-pg-'))
      fs.rmSync(path.dirname(cluster.dataDir), { recursive: true, force: true });
    fs.rmSync(dataDir, { recursive: true, force: true });
    fs.rmSync(`${dataDir}.secrets.json`, { force: true });
  };
  try {
    const env = { DATABASE_URL: cluster.databaseUrl };
    runTs('db/cli.ts', ['migrate'], env);
    runTs('db/cli.ts', ['seed'], env);
    const seeded = spawnSync(
      process.execPath,
      ['--import', 'tsx', 'scripts/bench/large-trial.ts'],
      { encoding: 'utf8', env: { ...process.env, ...env } },
    );
    if (seeded.status !== 0) throw new Error(`bench seed failed: ${seeded.stderr}`);
    const ids = JSON.parse(seeded.stdout.trim().split('\n').pop());
    return { databaseUrl: cluster.databaseUrl, dataDir, ids, stop };
  } catch (error) {
    stop();
    throw error;
  }
}

/** How many children of `pid` run api/server.ts (cluster workers), from Linux's /proc. */
function serverWorkerCount(pid) {
  try {
    return fs
      .readFileSync(`/proc/${pid}/task/${pid}/children`, 'utf8')
      .trim()
      .split(/\s+/)
      .filter(Boolean)
      .filter((child) => {
        try {
          return fs.readFileSync(`/proc/${child}/cmdline`, 'utf8').includes('server.ts');
        } catch {
          return false;
        }
      }).length;
  } catch {
    return 0;
  }
}

async function waitForHealth(base, server, timeoutMs = 60_000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (server.exitCode !== null) throw new Error(`server exited with ${server.exitCode}`);
    try {
      const res = await fetch(`${base}/api/health`);
      if (res.status === 200) return;
    } catch {
      // not listening yet
    }
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  throw new Error('server did not answer /api/health within a minute');
}

/**
 * Starts `node api/server.ts` with WEB_CONCURRENCY=workers; resolves once /api/health answers.
 * `workersRunning` counts the server's forked workers once it answers (1 when the server does
 * not fork: it then serves in its own process).
 */
export async function startServer({ database, workers, webDist, profileDir }) {
  const port = await freePort();
  const profileArgs = profileDir
    ? ['--cpu-prof', `--cpu-prof-dir=${path.resolve(profileDir)}`]
    : [];
  const server = spawn(process.execPath, [...profileArgs, '--import', 'tsx', 'api/server.ts'], {
    env: {
      ...process.env,
      NODE_ENV: 'test',
      HOST: '127.0.0.1',
      PORT: String(port),
      WEB_CONCURRENCY: String(workers),
      DATABASE_URL: database.databaseUrl,
      SESSION_SECRET: 'bench-session-secret-0123456789',
      SMTP_PORT: '0',
      WEB_DIST: webDist ?? path.join(database.dataDir, 'no-web-build'),
      UPLOAD_DIR: path.join(database.dataDir, 'uploads'),
      RATE_LIMIT_LOGIN: '100000',
    },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  // Keep reading the server's output so a full pipe never blocks it.
  server.stdout.on('data', () => {});
  const base = `http://127.0.0.1:${port}`;
  try {
    await waitForHealth(base, server);
  } catch (error) {
    if (server.exitCode === null) server.kill('SIGTERM');
    throw error;
  }
  // Workers may still be starting after the first answer: give them a moment before counting.
  await new Promise((resolve) => setTimeout(resolve, workers > 1 ? 3000 : 0));
  const forked = serverWorkerCount(server.pid);
  const stop = async () => {
    if (server.exitCode !== null) return;
    // Let requests still in flight when the load stopped finish before the server shuts down.
    await new Promise((resolve) => setTimeout(resolve, 1000));
    server.kill('SIGTERM');
    await new Promise((resolve) => {
      const timer = setTimeout(() => {
        server.kill('SIGKILL');
        resolve();
      }, 15_000);
      server.once('exit', () => {
        clearTimeout(timer);
        resolve();
      });
    });
  };
  return { base, workersAsked: workers, workersRunning: Math.max(1, forked), stop };
}

/** Signs in as the demo coordinator; returns the headers a signed-in request carries. */
export async function signIn(base, email = 'coordinator@millbrook.example') {
  const csrfRes = await fetch(`${base}/api/auth/csrf`);
  const csrfCookie = csrfRes.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  const { csrfToken } = await csrfRes.json();
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', cookie: csrfCookie, 'x-csrf-token': csrfToken },
    body: JSON.stringify({ email, password: 'sheaf-demo' }),
  });
  if (login.status !== 200) throw new Error(`bench sign-in failed: ${login.status}`);
  // Sign-in rotates the session and its CSRF token: keep every cookie set so far (the later one
  // of a name wins) and the token the sign-in answer hands out.
  const jar = new Map();
  for (const header of [...csrfRes.headers.getSetCookie(), ...login.headers.getSetCookie()]) {
    const [pair] = header.split(';');
    const [name] = pair.split('=');
    jar.set(name, pair);
  }
  const cookie = [...jar.values()].join('; ');
  return { cookie, 'x-csrf-token': login.headers.get('x-csrf-token') ?? csrfToken };
}
