// One API process: connects to PostgreSQL, serves the app on PORT (alone or as a cluster
// worker) and closes everything on SIGTERM/SIGINT after in-flight requests finish. Kept apart
// from server.ts so the cluster primary, which serves nothing, never loads the app.
import 'reflect-metadata';
import http from 'node:http';
import pg from 'pg';
import { createDataSource } from '../db/data-source';
import { createApp } from './app';
import type { AppConfig } from './config/env';
import { createSmtpMailer } from './mail/mailer';
import { closePdfBrowser } from './reports/reports.pdf';

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
export async function serve(config: AppConfig, announce: (port: number) => void) {
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
  const app = createApp({
    config,
    dataSource,
    sessionPool,
    mailer,
    jobs: { queue: 'default' },
  });
  // A client that trickles its headers or body in is cut off (408) instead of holding a socket;
  // the timeouts are checked every second rather than Node's default 30 s.
  const server = http.createServer(
    {
      headersTimeout: config.HEADERS_TIMEOUT_MS,
      requestTimeout: Math.max(config.REQUEST_TIMEOUT_MS, config.HEADERS_TIMEOUT_MS),
      connectionsCheckingInterval: 1000,
    },
    app,
  );
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
      await app.locals.jobRunner?.stop();
      await closePdfBrowser();
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
