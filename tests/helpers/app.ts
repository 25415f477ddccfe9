// The real Sheaf API for tests: by default the two-worker server the global setup started (every
// request may reach either worker), or a server of a test's own when it needs other settings; a
// DataSource of the test's own for arranging data; the mail catcher; signed-in supertest clients
// that carry the CSRF header.
import 'reflect-metadata';
import crypto from 'node:crypto';
import pg from 'pg';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { inject } from 'vitest';
import { readConfig, type AppConfig } from '../../api/config/env';
import type { RouteEntry } from '../../api/lib/route-table';
import { fetchCaughtMail } from '../../api/mail/mail-catcher';
import { DEFAULT_BCRYPT_COST, hashPassword } from '../../api/lib/passwords';
import { createDataSource } from '../../db/data-source';
import type { CaughtMail } from '../../shared/schemas/auth';
import { freePort, startApiServer } from './spawn-server';

export const DEMO_PASSWORD = 'sheaf-demo';

/** The caught mail of the catcher process, read over its loopback HTTP port. */
export interface MailReader {
  list(): Promise<CaughtMail[]>;
  /** Resolves with the first message (already caught or arriving) that matches. */
  waitFor(match: (mail: CaughtMail) => boolean, timeoutMs?: number): Promise<CaughtMail>;
}

export interface TestApp {
  /** The server's base URL (supertest and fetch take it). */
  app: string;
  config: AppConfig;
  dataSource: DataSource;
  mailCatcher: MailReader;
  /** Every route and its access policy, as the app registers them. */
  routes(): Promise<RouteEntry[]>;
  /** The environment the server was started with (to start another one like it). */
  serverEnv: Record<string, string>;
  close(): Promise<void>;
}

export function testDatabaseUrl(): string {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set: run the tests through `npm test`');
  return url;
}

function sharedServer() {
  const shared = inject('sheafServer');
  if (!shared) throw new Error('No test server: run the tests through `npm test`');
  return shared;
}

function mailReader(catcherUrl: string): MailReader {
  return {
    list: () => fetchCaughtMail(catcherUrl),
    async waitFor(match, timeoutMs = 10_000) {
      const deadline = Date.now() + timeoutMs;
      for (;;) {
        const found = (await fetchCaughtMail(catcherUrl)).find(match);
        if (found) return found;
        if (Date.now() > deadline) throw new Error('No matching e-mail arrived in time');
        await new Promise((resolve) => setTimeout(resolve, 100));
      }
    },
  };
}

/**
 * The route table of the app, read from an app built in this process (it is never served).
 * Loaded on demand: importing the whole API takes seconds, and most test files never need it.
 */
async function routeTable(config: AppConfig, dataSource: DataSource): Promise<RouteEntry[]> {
  const { createApp } = await import('../../api/app');
  // The pool is never used: no request reaches this app, so it opens no connection.
  const sessionPool = new pg.Pool({ connectionString: config.DATABASE_URL, max: 1 });
  const app = createApp({
    config,
    dataSource,
    sessionPool,
    mailer: { send: async () => {} } as never,
  });
  void sessionPool.end();
  return app.locals.routeTable as RouteEntry[];
}

/**
 * The shared two-worker server, or (with `env` settings or `ownServer`) a two-worker server of
 * this test's own with those settings, stopped by close().
 */
export async function createTestApp(
  env: Record<string, string> = {},
  options: { ownServer?: boolean } = {},
): Promise<TestApp> {
  const shared = sharedServer();
  const own = options.ownServer || Object.keys(env).some((key) => shared.env[key] !== env[key]);
  let url = shared.url;
  let serverEnv = shared.env;
  let stop = async () => {};
  if (own) {
    const port = await freePort();
    // Production mode refuses the tests' low bcrypt cost: such a server gets production's lowest.
    const cost: Record<string, string> = env.NODE_ENV === 'production' ? { BCRYPT_COST: '10' } : {};
    serverEnv = { ...shared.env, PORT: String(port), ...cost, ...env };
    const server = await startApiServer(serverEnv);
    url = `http://127.0.0.1:${port}`;
    stop = server.stop;
  }
  const config = readConfig(serverEnv);
  const dataSource = createDataSource(config.DATABASE_URL, { poolSize: 5 });
  await dataSource.initialize();
  return {
    app: url,
    config,
    dataSource,
    mailCatcher: mailReader(shared.catcherUrl),
    routes: () => routeTable(config, dataSource),
    serverEnv,
    async close() {
      await Promise.allSettled([dataSource.destroy(), stop()]);
    },
  };
}

export type Client = ReturnType<typeof clientFor>;

/** A supertest agent that keeps cookies and sends the CSRF token on writes. */
export function clientFor(app: string) {
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
  app: string,
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
  cachedHash ??= await hashPassword(
    DEMO_PASSWORD,
    Number(process.env.BCRYPT_COST ?? DEFAULT_BCRYPT_COST),
  );
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
