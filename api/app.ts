// createApp(deps): the Express app serving the API and the built web app; no listen() here.
import path from 'node:path';
import fs from 'node:fs';
import compression from 'compression';
import express, { type Express } from 'express';
import helmet from 'helmet';
import type pg from 'pg';
import type { DataSource } from 'typeorm';
import type { AppConfig } from './config/env';
import { createAdminRouter, servesCaughtMail } from './admin/admin.router';
import { createAuthRouter } from './auth/auth.router';
import { createAuthService } from './auth/auth.service';
import { createSignUpRouter } from './auth/sign-up.router';
import { createCalcRouter } from './calc/calc.router';
import { createHealthRouter } from './health/health.router';
import { createImportsRouter } from './imports/imports.router';
import { createHistoryRouter } from './audit/history.router';
import { createNetworksRouter } from './networks/networks.router';
import { createPeopleRouter } from './people/people.router';
import { createSiteChangesRouter } from './people/site-changes.router';
import { createPhotosRouter } from './photos/photos.router';
import { createProgressRouter } from './progress/progress.router';
import { createSiteDataRouter } from './site-data/site-data.router';
import { createStripsRouter } from './strips/strips.router';
import { createHomeRouter } from './home/home.router';
import { createInvitationsRouter } from './invitations/invitations.router';
import { createInvitationsService } from './invitations/invitations.service';
import type { RouteEntry } from './lib/route-table';
import type { RouterContext } from './lib/router-context';
import type { Mailer } from './mail/mailer';
import { createPolicies } from './middleware/access';
import { createCsrf } from './middleware/csrf';
import { rejectUnsafeText } from './middleware/body-guard';
import { idempotency } from './middleware/idempotency';
import { startJobRunner, type JobRunner } from './lib/job-runner';
import { createWebShell } from './lib/web-shell';
import { errorHandler, notFoundApi } from './middleware/error-handler';
import { createPassport, createSessionMiddleware } from './middleware/session';
import { createReportsRouter } from './reports/reports.router';
import { createSeriesRouter } from './series/series.router';
import { createSitesRouter } from './sites/sites.router';
import { createTrialsRouter } from './trials/trials.router';

export interface AppDeps {
  config: AppConfig;
  dataSource: DataSource;
  /** pg pool for the session store. */
  sessionPool: pg.Pool;
  mailer: Mailer;
  /** Run background jobs (password-reset mail) of this queue in this process. */
  jobs?: { queue: string; pollMs?: number };
}

/**
 * Feature routers, mounted under /api in this order. Express tries them one after another, so
 * the busiest (reports, strip entry) come first; no two routers answer the same path.
 */
const FEATURE_ROUTERS: ((ctx: RouterContext) => express.Router)[] = [
  createReportsRouter,
  createStripsRouter,
  createTrialsRouter,
  createSitesRouter,
  createCalcRouter,
  createImportsRouter,
  createPhotosRouter,
  createProgressRouter,
  // Before site data: it answers PATCH /sites/:siteId for hand-over, lost and naming and passes
  // dates and notes on.
  createSiteChangesRouter,
  createSiteDataRouter,
  createPeopleRouter,
  createNetworksRouter,
  createHistoryRouter,
  createSeriesRouter,
];

export function createApp(deps: AppDeps): Express {
  const { config, dataSource } = deps;
  const app = express();
  const table: RouteEntry[] = [];
  app.locals.routeTable = table;
  app.disable('x-powered-by');
  // No ETag hashing of large JSON bodies on every request; static files keep their own ETags.
  app.set('etag', false);
  if (config.TRUST_PROXY === 'on') app.set('trust proxy', 1);
  if (config.NODE_ENV === 'test') {
    // Lets tests see that requests reach different worker processes; never sent outside tests.
    app.use((_req, res, next) => {
      res.set('X-Sheaf-Worker', String(process.pid));
      next();
    });
  }

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          // vega-embed and React set styles at run time; scripts stay strictly same-origin.
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
        },
      },
      strictTransportSecurity: config.NODE_ENV === 'production',
    }),
  );

  // JSON answers and the app's page go gzip- or brotli-compressed when the browser takes it: a
  // site's strips are ~30 kB of JSON, ~4 kB compressed, and on a phone's slow link that is the
  // wait before the page shows. Build assets carry their own .br/.gz copies and are left alone.
  // Sign-in answers (session and CSRF token) stay as they are, so no reflected input can be used
  // to guess a secret from the compressed length.
  app.use(
    compression({
      filter: (req, res) => !req.path.startsWith('/api/auth/') && compression.filter(req, res),
    }),
  );

  const policies = createPolicies(dataSource);
  let jobRunner: JobRunner | null = null;
  const auth = createAuthService({
    dataSource,
    mailer: deps.mailer,
    publicUrl: config.PUBLIC_URL,
    passwordCost: config.BCRYPT_COST,
    jobQueue: deps.jobs?.queue,
  });
  if (deps.jobs)
    jobRunner = startJobRunner(dataSource, auth.jobHandlers, {
      queue: deps.jobs.queue,
      pollMs: deps.jobs.pollMs,
    });
  app.locals.jobRunner = jobRunner;
  const csrf = createCsrf({
    secret: config.SESSION_SECRET,
    secure: config.NODE_ENV === 'production',
  });
  const invitations = createInvitationsService({
    dataSource,
    mailer: deps.mailer,
    publicUrl: config.PUBLIC_URL,
    passwordCost: config.BCRYPT_COST,
  });
  const ctx: RouterContext = {
    config,
    dataSource,
    policies,
    table,
    mailer: deps.mailer,
    auth,
    invitations,
    csrf,
  };

  // Health answers before sessions so it works with the database down.
  app.use('/api', createHealthRouter(ctx));

  const passport = createPassport(auth, dataSource);
  app.use('/api', express.json({ limit: '1mb' }));
  app.use('/api', rejectUnsafeText);
  app.use('/api', createSessionMiddleware(config, deps.sessionPool));
  // passport.session() sets up req.login/logout itself; initialize() only adds a compatibility
  // shim for old strategies, and cost ~5 % of a cached report request.
  app.use('/api', passport.session());
  app.use('/api', csrf.require);
  app.use('/api', idempotency(dataSource));

  app.use(
    '/api/auth',
    createAuthRouter({
      auth,
      policies,
      table,
      loginLimit: config.RATE_LIMIT_LOGIN,
      dataSource,
      csrf,
    }),
  );
  app.use('/api/auth', createSignUpRouter(ctx));
  app.use('/api', createInvitationsRouter({ ...ctx, inviteLimit: config.RATE_LIMIT_INVITES }));
  app.use('/api', createHomeRouter(ctx));
  app.use(
    '/api/admin',
    createAdminRouter({
      catcherUrl: servesCaughtMail(config) ? config.MAIL_CATCHER_URL! : null,
      dataSource,
      policies,
      table,
    }),
  );
  for (const build of FEATURE_ROUTERS) app.use('/api', build(ctx));
  app.use('/api', notFoundApi);

  const webRoot = path.resolve(config.WEB_DIST);
  if (fs.existsSync(path.join(webRoot, 'index.html'))) {
    app.use(precompressed(webRoot));
    app.use(express.static(webRoot, { index: false, maxAge: '1h', setHeaders: staticHeaders }));
    const webShell = createWebShell(webRoot);
    app.get('/{*splat}', (req, res) => {
      const page = webShell(req.path);
      res.set({ 'Cache-Control': 'no-cache', ETag: page.etag });
      res.type('html').send(page.html);
    });
  }
  app.use(errorHandler);
  return app;
}

const ENCODINGS = [
  { name: 'br', suffix: '.br' },
  { name: 'gzip', suffix: '.gz' },
] as const;

/**
 * Serves the .br or .gz copy the build wrote beside a text asset when the browser accepts it.
 * The list of copies is read once: the build folder does not change while the server runs.
 */
function precompressed(webRoot: string): express.RequestHandler {
  const copies = new Set<string>();
  const walk = (dir: string) => {
    for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else if (/\.(br|gz)$/.test(entry.name))
        copies.add(`/${path.relative(webRoot, full).split(path.sep).join('/')}`);
    }
  };
  walk(webRoot);
  return (req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return next();
    const accepted = String(req.headers['accept-encoding'] ?? '');
    for (const encoding of ENCODINGS) {
      if (!copies.has(req.path + encoding.suffix)) continue;
      res.vary('Accept-Encoding');
      if (!new RegExp(`\\b${encoding.name}\\b`).test(accepted)) continue;
      req.url = req.url.replace(req.path, req.path + encoding.suffix);
      break;
    }
    next();
  };
}

/** Hashed assets never change: a year, immutable. The shell and the service worker: always ask. */
function staticHeaders(res: express.Response, filePath: string) {
  const encoding = ENCODINGS.find((e) => filePath.endsWith(e.suffix));
  const original = encoding ? filePath.slice(0, -encoding.suffix.length) : filePath;
  if (encoding) {
    res.set('Content-Encoding', encoding.name);
    res.type(path.extname(original));
  }
  if (original.includes(`${path.sep}assets${path.sep}`))
    res.set('Cache-Control', 'public, max-age=31536000, immutable');
  else if (/(sw\.js|manifest\.webmanifest|index\.html)$/.test(original))
    res.set('Cache-Control', 'no-cache');
}
