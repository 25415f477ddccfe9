// Builds the real app against the test PostgreSQL that `npm test` started, with a mail
// catcher of its own; plus signed-in supertest clients that carry the CSRF header.
import 'reflect-metadata';
import crypto from 'node:crypto';
import pg from 'pg';
import request from 'supertest';
import type { Express } from 'express';
import type { DataSource } from 'typeorm';
import { createApp } from '../../api/app';
import { readConfig, type AppConfig } from '../../api/config/env';
import { startMailCatcher, type MailCatcher } from '../../api/mail/mail-catcher';
import { createSmtpMailer } from '../../api/mail/mailer';
import { hashPassword } from '../../api/auth/auth.service';
import { createDataSource } from '../../db/data-source';

export const DEMO_PASSWORD = 'sheaf-demo';

export interface TestApp {
  app: Express;
  config: AppConfig;
  dataSource: DataSource;
  mailCatcher: MailCatcher;
  close(): Promise<void>;
}

export function testDatabaseUrl(): string {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set: run the tests through `npm test`');
  return url;
}

export async function createTestApp(env: Record<string, string> = {}): Promise<TestApp> {
  const mailCatcher = await startMailCatcher({ port: 0 });
  const config = readConfig({
    NODE_ENV: 'test',
    DATABASE_URL: testDatabaseUrl(),
    SESSION_SECRET: 'test-session-secret-of-enough-length',
    PUBLIC_URL: 'http://sheaf.test',
    SMTP_PORT: String(mailCatcher.port),
    RATE_LIMIT_LOGIN: '1000',
    UPLOAD_DIR: `.data/test-uploads-${process.pid}`,
    ...env,
  });
  const dataSource = createDataSource(config.DATABASE_URL, { poolSize: 5 });
  await dataSource.initialize();
  const sessionPool = new pg.Pool({
    connectionString: config.DATABASE_URL,
    max: 3,
    connectionTimeoutMillis: 2000,
  });
  sessionPool.on('error', () => {});
  const mailer = createSmtpMailer({
    host: '127.0.0.1',
    port: mailCatcher.port,
    from: config.MAIL_FROM,
  });
  // Each test app runs its own job queue, so its mail reaches its own catcher.
  const app = createApp({
    config,
    dataSource,
    sessionPool,
    mailer,
    mailCatcher,
    jobs: { queue: `test-${crypto.randomBytes(6).toString('hex')}`, pollMs: 200 },
  });
  return {
    app,
    config,
    dataSource,
    mailCatcher,
    async close() {
      await app.locals.jobRunner?.stop();
      await Promise.allSettled([dataSource.destroy(), sessionPool.end(), mailCatcher.close()]);
    },
  };
}

export type Client = ReturnType<typeof clientFor>;

/** A supertest agent that keeps cookies and sends the CSRF token on writes. */
export function clientFor(app: Express) {
  const agent = request.agent(app);
  let token: string | null = null;
  async function csrf(): Promise<string> {
    if (!token) {
      const res = await agent.get('/api/auth/csrf');
      token = res.body.csrfToken as string;
    }
    return token;
  }
  return {
    agent,
    csrf,
    forgetCsrf() {
      token = null;
    },
    get: (url: string) => agent.get(url),
    // The token is fetched before the request is built: the agent copies cookies at creation.
    post: async (url: string, body?: object) => {
      const sent = await csrf();
      const res = await agent
        .post(url)
        .set('X-CSRF-Token', sent)
        .send(body ?? {});
      // Sign-in hands out the new session's token.
      const fresh = res.headers['x-csrf-token'];
      if (typeof fresh === 'string') token = fresh;
      return res;
    },
    patch: async (url: string, body?: object) => {
      const token = await csrf();
      return agent
        .patch(url)
        .set('X-CSRF-Token', token)
        .send(body ?? {});
    },
    put: async (url: string, body?: object) => {
      const token = await csrf();
      return agent
        .put(url)
        .set('X-CSRF-Token', token)
        .send(body ?? {});
    },
    delete: async (url: string) => {
      const token = await csrf();
      return agent.delete(url).set('X-CSRF-Token', token);
    },
  };
}

export async function signIn(
  app: Express,
  email: string,
  password = DEMO_PASSWORD,
): Promise<Client> {
  const client = clientFor(app);
  const res = await client.post('/api/auth/login', { email, password });
  if (res.status !== 200)
    throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return client;
}

export interface BuiltNetwork {
  networkId: string;
  suffix: string;
  emails: { admin: string; coordinator: string; grower: string; grower2: string; member: string };
  userIds: { admin: string; coordinator: string; grower: string; grower2: string; member: string };
}

let cachedHash: string | null = null;

/** A fresh network with one account per role (unique e-mails), so tests do not share state. */
export async function buildNetwork(
  dataSource: DataSource,
  label = 'Test network',
): Promise<BuiltNetwork> {
  cachedHash ??= await hashPassword(DEMO_PASSWORD);
  const suffix = crypto.randomBytes(4).toString('hex');
  const [network] = await dataSource.query(
    'INSERT INTO networks (name, slug) VALUES ($1, $2) RETURNING id',
    [`${label} ${suffix}`, `test-${suffix}`],
  );
  const roles = ['admin', 'coordinator', 'grower', 'grower2', 'member'] as const;
  const emails = {} as BuiltNetwork['emails'];
  const userIds = {} as BuiltNetwork['userIds'];
  for (const key of roles) {
    const email = `${key}-${suffix}@test.example`;
    const [user] = await dataSource.query(
      'INSERT INTO users (email, name, password_hash) VALUES ($1, $2, $3) RETURNING id',
      [email, `${key} ${suffix}`, cachedHash],
    );
    await dataSource.query(
      'INSERT INTO memberships (user_id, network_id, role) VALUES ($1, $2, $3)',
      [user.id, network.id, key === 'grower2' ? 'grower' : key],
    );
    emails[key] = email;
    userIds[key] = user.id;
  }
  return { networkId: network.id, suffix, emails, userIds };
}

export async function demoIds(dataSource: DataSource) {
  const [trial] = await dataSource.query(
    `SELECT id FROM trials WHERE name = 'Hulless oat seeding rate 2027'`,
  );
  const sites: { id: string; email: string }[] = await dataSource.query(
    `SELECT s.id, u.email FROM sites s JOIN users u ON u.id = s.grower_user_id WHERE s.trial_id = $1 ORDER BY u.email`,
    [trial.id],
  );
  return { oatTrialId: trial.id as string, sites };
}
