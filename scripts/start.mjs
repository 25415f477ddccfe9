// npm start: install what is missing, start PostgreSQL on 127.0.0.1 in .data/postgres,
// migrate, load the invented demo once, build the web app, start the local mail catcher process
// and serve the app (WEB_CONCURRENCY worker processes, default 1). Ctrl-C or SIGTERM stops all
// of it, PostgreSQL included.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { ensureNodeModules } from './lib/deps.mjs';
import { DATA_DIR, buildWeb, runTs, sessionSecret, stopWhenOrphaned } from './lib/env.mjs';
import { startCluster } from './lib/postgres.mjs';

const PORT = Number(process.env.PORT ?? 3000);
const PGPORT = Number(process.env.PGPORT ?? 54329);
const SMTP_PORT = Number(process.env.SMTP_PORT ?? 2525);
const CATCHER_HTTP_PORT = Number(process.env.MAIL_CATCHER_HTTP_PORT ?? SMTP_PORT + 1);
const CATCHER_ON = (process.env.MAIL_CATCHER ?? 'on') !== 'off';

ensureNodeModules();
const cluster = await startCluster({ dataDir: path.join(DATA_DIR, 'postgres'), port: PGPORT });
let server = null;
let catcher = null;
let stopping = false;

function stopAll(code) {
  if (stopping) return;
  stopping = true;
  const finish = () => {
    if (catcher && catcher.exitCode === null) catcher.kill('SIGTERM');
    if (!cluster.alreadyRunning) {
      console.log('[sheaf] stopping PostgreSQL');
      cluster.stop();
    }
    process.exit(code);
  };
  if (server && server.exitCode === null && server.signalCode === null) {
    server.once('exit', finish);
    server.kill('SIGTERM');
  } else finish();
}
process.on('SIGINT', () => stopAll(0));
process.on('SIGTERM', () => stopAll(0));
stopWhenOrphaned(() => stopAll(0));

try {
  const env = { DATABASE_URL: cluster.databaseUrl };
  runTs('db/cli.ts', ['migrate'], env);
  runTs('db/cli.ts', ['seed'], env);
  runTs('api/cli/publish-demo.ts', [], env);
  buildWeb('dist/web');
} catch (error) {
  console.error(`[sheaf] ${error.message}`);
  stopAll(1);
}

if (!stopping && CATCHER_ON) {
  // The mail catcher is its own process, so every API worker sends to and reads from one place.
  catcher = spawn(process.execPath, ['--import', 'tsx', 'api/mail/catcher-process.ts'], {
    stdio: ['ignore', 'inherit', 'inherit'],
    env: {
      ...process.env,
      NODE_ENV: process.env.NODE_ENV ?? 'development',
      SMTP_PORT: String(SMTP_PORT),
      MAIL_CATCHER_HTTP_PORT: String(CATCHER_HTTP_PORT),
    },
  });
  catcher.on('exit', (code) => {
    if (!stopping) {
      console.error(`[sheaf] the mail catcher stopped (${code}); stopping`);
      stopAll(1);
    }
  });
}

if (!stopping) {
  const publicUrl = process.env.PUBLIC_URL ?? `http://127.0.0.1:${PORT}`;
  server = spawn(process.execPath, ['--import', 'tsx', 'api/server.ts'], {
    stdio: ['inherit', 'pipe', 'inherit'],
    env: {
      ...process.env,
      NODE_ENV: process.env.NODE_ENV ?? 'development',
      HOST: '127.0.0.1',
      PORT: String(PORT),
      DATABASE_URL: cluster.databaseUrl,
      SESSION_SECRET: sessionSecret(),
      PUBLIC_URL: publicUrl,
      SMTP_PORT: String(SMTP_PORT),
      ...(CATCHER_ON ? { MAIL_CATCHER_URL: `http://127.0.0.1:${CATCHER_HTTP_PORT}` } : {}),
      UPLOAD_DIR: process.env.UPLOAD_DIR ?? path.join(DATA_DIR, 'uploads'),
    },
  });
  server.on('exit', (code) => {
    if (!stopping) stopAll(code ?? 1);
  });
  let announced = false;
  server.stdout.on('data', (chunk) => {
    process.stdout.write(chunk);
    if (announced || !chunk.toString().includes('listening on')) return;
    announced = true;
    console.log(`
  Sheaf is running at ${publicUrl}
  Demo sign-ins (invented demo data; password for all: sheaf-demo):
    coordinator@millbrook.example   admin@millbrook.example   member@millbrook.example
    grower1@millbrook.example … grower8@millbrook.example
  E-mail is caught locally; admins read it at ${publicUrl}/admin/mail
  Press Ctrl-C to stop (PostgreSQL stops too).
`);
  });
}
