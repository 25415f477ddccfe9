// Reads the environment, connects to PostgreSQL and listens. With WEB_CONCURRENCY=N above 1 a
// primary process forks N workers (Node's cluster module) that share PORT; every worker is the
// same stateless app, since PostgreSQL holds all shared state. SIGTERM/SIGINT finish in-flight
// requests and close everything.
import 'reflect-metadata';
import cluster from 'node:cluster';
import http from 'node:http';
import pg from 'pg';
import { createDataSource } from '../db/data-source';
import { createApp } from './app';
import { readConfig, type AppConfig } from './config/env';
import { createSmtpMailer } from './mail/mailer';

async function connectWithRetry(init: () => Promise<unknown>, attempts = 30): Promise<void> {
  for (let i = 1; ; i += 1) {
    try {
      await init();
      return;
    } catch (error) {
      if (i >= attempts) throw error;
      console.log(`[sheaf] waiting for PostgreSQL (${(error as Error).message})`);
      await new Promise((r) => setTimeout(r, 1000));
    }
  }
}

/** One API process: the app on PORT, alone or as a cluster worker. */
async function serve(config: AppConfig, announce: (port: number) => void) {
  const dataSource = createDataSource(config.DATABASE_URL);
  await connectWithRetry(() => dataSource.initialize());
  const sessionPool = new pg.Pool({
    connectionString: config.DATABASE_URL,
    max: 5,
    connectionTimeoutMillis: 2000,
  });
  sessionPool.on('error', () => {});
  const mailer = createSmtpMailer({
    host: config.SMTP_HOST,
    port: config.SMTP_PORT,
    from: config.MAIL_FROM,
  });
  const app = createApp({ config, dataSource, sessionPool, mailer });
  const server = http.createServer(app);
  server.keepAliveTimeout = 5000;
  await new Promise<void>((resolve) => server.listen(config.PORT, config.HOST, resolve));
  const address = server.address();
  announce(typeof address === 'object' && address ? address.port : config.PORT);

  let stopping = false;
  const shutdown = () => {
    if (stopping) return;
    stopping = true;
    const force = setTimeout(() => process.exit(1), 10_000);
    force.unref();
    server.close(async () => {
      await Promise.allSettled([dataSource.destroy(), sessionPool.end()]);
      process.exit(0);
    });
    // Keep-alive sockets become idle as in-flight requests finish; close them as they do.
    server.closeIdleConnections();
    setInterval(() => server.closeIdleConnections(), 100).unref();
  };
  process.on('SIGTERM', shutdown);
  process.on('SIGINT', shutdown);
}

/** The cluster primary: forks the workers, replaces one that crashes, stops them all on a signal. */
function supervise(config: AppConfig) {
  const count = config.WEB_CONCURRENCY;
  let listening = 0;
  let stopping = false;
  let port = config.PORT;
  const fork = () => cluster.fork();
  cluster.on('message', (_worker, message: { listening?: number }) => {
    if (typeof message?.listening !== 'number') return;
    port = message.listening;
    listening += 1;
    if (listening === count)
      console.log(`[sheaf] listening on http://${config.HOST}:${port} (${count} workers)`);
  });
  cluster.on('exit', (worker, code, signal) => {
    if (stopping || code === 0) {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
      return;
    }
    console.error(
      `[sheaf] worker ${worker.process.pid} stopped (${signal ?? code}); starting another`,
    );
    setTimeout(fork, 500);
  });
  const stop = (signal: NodeJS.Signals) => {
    if (stopping) return;
    stopping = true;
    console.log(`[sheaf] ${signal}: finishing requests and shutting down`);
    for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill('SIGTERM');
    setTimeout(() => process.exit(1), 12_000).unref();
  };
  process.on('SIGTERM', () => stop('SIGTERM'));
  process.on('SIGINT', () => stop('SIGINT'));
  for (let i = 0; i < count; i += 1) fork();
}

function main() {
  const config = readConfig();
  if (config.WEB_CONCURRENCY > 1 && cluster.isPrimary) {
    supervise(config);
    return;
  }
  const worker = cluster.isWorker;
  return serve(config, (port) => {
    if (worker) process.send?.({ listening: port });
    else console.log(`[sheaf] listening on http://${config.HOST}:${port}`);
  });
}

Promise.resolve()
  .then(main)
  .catch((error) => {
    console.error(error instanceof Error ? error.message : error);
    process.exit(1);
  });
