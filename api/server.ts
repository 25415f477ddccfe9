// Reads the environment, connects to PostgreSQL, starts the mail catcher and listens;
// on SIGTERM/SIGINT it finishes in-flight requests and closes everything.
import 'reflect-metadata';
import http from 'node:http';
import pg from 'pg';
import { createDataSource } from '../db/data-source';
import { createApp } from './app';
import { readConfig } from './config/env';
import { startMailCatcher, type MailCatcher } from './mail/mail-catcher';
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

async function main() {
  const config = readConfig();
  const dataSource = createDataSource(config.DATABASE_URL);
  await connectWithRetry(() => dataSource.initialize());
  const sessionPool = new pg.Pool({
    connectionString: config.DATABASE_URL,
    max: 5,
    connectionTimeoutMillis: 2000,
  });
  sessionPool.on('error', () => {});
  let mailCatcher: MailCatcher | null = null;
  if (config.MAIL_CATCHER === 'on' && config.NODE_ENV !== 'production') {
    mailCatcher = await startMailCatcher({ host: config.SMTP_HOST, port: config.SMTP_PORT });
  }
  const mailer = createSmtpMailer({
    host: config.SMTP_HOST,
    port: mailCatcher?.port ?? config.SMTP_PORT,
    from: config.MAIL_FROM,
  });
  const app = createApp({
    config,
    dataSource,
    sessionPool,
    mailer,
    mailCatcher,
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
  const port = typeof address === 'object' && address ? address.port : config.PORT;
  console.log(`[sheaf] listening on http://${config.HOST}:${port}`);
  if (mailCatcher)
    console.log(`[sheaf] catching e-mail on smtp://${config.SMTP_HOST}:${mailCatcher.port}`);

  let stopping = false;
  const shutdown = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`[sheaf] ${signal}: finishing requests and shutting down`);
    const force = setTimeout(() => process.exit(1), 10_000);
    force.unref();
    server.close(async () => {
      await app.locals.jobRunner?.stop();
      await closePdfBrowser();
      await Promise.allSettled([dataSource.destroy(), sessionPool.end(), mailCatcher?.close()]);
      process.exit(0);
    });
    // Keep-alive sockets become idle as in-flight requests finish; close them as they do.
    server.closeIdleConnections();
    setInterval(() => server.closeIdleConnections(), 100).unref();
  };
  process.on('SIGTERM', () => shutdown('SIGTERM'));
  process.on('SIGINT', () => shutdown('SIGINT'));
}

main().catch((error) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
