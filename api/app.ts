// createApp(deps): the Express app serving the API and the built web app; no listen() here.
import path from 'node:path';
import fs from 'node:fs';
import express, { type Express } from 'express';
import helmet from 'helmet';
import type pg from 'pg';
import type { DataSource } from 'typeorm';
import type { AppConfig } from './config/env';
import { createAdminRouter, servesCaughtMail } from './admin/admin.router';
import { createAuthRouter } from './auth/auth.router';
import { createAuthService } from './auth/auth.service';
import { createCalcRouter } from './calc/calc.router';
import { createHealthRouter } from './health/health.router';
import { createImportsRouter } from './imports/imports.router';
import { createPeopleRouter } from './people/people.router';
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
import { requireCsrf } from './middleware/csrf';
import { errorHandler, notFoundApi } from './middleware/error-handler';
import { createPassport, createSessionMiddleware } from './middleware/session';
import { createReportsRouter } from './reports/reports.router';
import { createSitesRouter } from './sites/sites.router';
import { createTrialsRouter } from './trials/trials.router';

export interface AppDeps {
  config: AppConfig;
  dataSource: DataSource;
  /** pg pool for the session store. */
  sessionPool: pg.Pool;
  mailer: Mailer;
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
  createSiteDataRouter,
  createPeopleRouter,
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

  const policies = createPolicies(dataSource);
  const auth = createAuthService({ dataSource, mailer: deps.mailer, publicUrl: config.PUBLIC_URL });
  const invitations = createInvitationsService({
    dataSource,
    mailer: deps.mailer,
    publicUrl: config.PUBLIC_URL,
  });
  const ctx: RouterContext = {
    config,
    dataSource,
    policies,
    table,
    mailer: deps.mailer,
    auth,
    invitations,
  };

  // Health answers before sessions so it works with the database down.
  app.use('/api', createHealthRouter(ctx));

  const passport = createPassport(auth, dataSource);
  app.use('/api', express.json({ limit: '1mb' }));
  app.use('/api', createSessionMiddleware(config, deps.sessionPool));
  // passport.session() sets up req.login/logout itself; initialize() only adds a compatibility
  // shim for old strategies, and cost ~5 % of a cached report request.
  app.use('/api', passport.session());
  app.use('/api', requireCsrf);

  app.use(
    '/api/auth',
    createAuthRouter({ auth, policies, table, loginLimit: config.RATE_LIMIT_LOGIN }),
  );
  app.use('/api', createInvitationsRouter({ ...ctx, inviteLimit: config.RATE_LIMIT_LOGIN * 5 }));
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
    app.use(
      express.static(webRoot, { index: false, maxAge: '1h', setHeaders: cacheImmutableAssets }),
    );
    app.get('/{*splat}', (_req, res) => {
      res.set('Cache-Control', 'no-cache');
      // root keeps the dot-folder check off the build folder itself (e.g. .data/web-x).
      res.sendFile('index.html', { root: webRoot });
    });
  }
  app.use(errorHandler);
  return app;
}

function cacheImmutableAssets(res: express.Response, filePath: string) {
  if (filePath.includes(`${path.sep}assets${path.sep}`))
    res.set('Cache-Control', 'public, max-age=31536000, immutable');
}
