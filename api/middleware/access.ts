// Access policies: who may call a route, decided from the session user and their memberships.
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/schemas/common';
import { Forbidden, NotFound, Unauthenticated } from '../errors';
import { preparedQuery } from '../../db/prepared';
import { createFreshCache, SHORT_LIVED } from '../lib/fresh-cache';

export type PolicyKind =
  | 'public'
  | 'signed-in'
  | 'admin'
  | 'network-coordinator'
  | 'trial-coordinator'
  | 'trial-reader'
  | 'pooled-reader'
  | 'site-coordinator'
  | 'site-grower'
  | 'site-reader'
  | 'strip-grower'
  | 'attachment-reader';

export interface Policy {
  kind: PolicyKind;
  /** Which route parameter names the resource the policy guards. */
  param?: string;
  middleware: RequestHandler;
}

export interface AccessContext {
  userId: string;
  roles: Map<string, Role>;
}

const COORDINATING: Role[] = ['admin', 'coordinator'];

declare module 'express-serve-static-core' {
  interface Request {
    access?: AccessContext;
  }
}

export function isCoordinating(role: Role | undefined): boolean {
  return role !== undefined && COORDINATING.includes(role);
}

/** Builds the policies against one DataSource. */
export function createPolicies(dataSource: DataSource) {
  const memberships = createFreshCache<Map<string, Role>>(SHORT_LIVED);
  async function context(req: Request): Promise<AccessContext> {
    const userId = req.user?.id;
    if (!userId) throw new Unauthenticated();
    if (req.access) return req.access;
    const roles = await memberships.get(userId, async () => {
      const rows = await preparedQuery<{ network_id: string; role: Role }>(
        dataSource,
        'SELECT network_id, role FROM memberships WHERE user_id = $1',
        [userId],
      );
      return new Map(rows.map((r) => [r.network_id, r.role]));
    });
    req.access = { userId, roles };
    return req.access;
  }

  function uuidParam(req: Request, name: string, what: string): string {
    const value = req.params[name];
    // The 8-4-4-4-12 shape PostgreSQL's uuid type accepts: anything looser (36 dashes) reached
    // the query and came back as a 500 (invalid input syntax for type uuid).
    if (
      typeof value !== 'string' ||
      !/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(value)
    )
      throw new NotFound(what);
    return value;
  }

  // Which network a trial belongs to, which trial and network a site belongs to, and which site
  // a strip or photo belongs to never change once written: kept across writes. What can change
  // (grower, published, what is published) is kept only until this process writes anything.
  const forever = { keepAcrossWrites: true, maxAgeMs: 10 * 60_000, maxEntries: 20_000 };
  const trialNetworks = createFreshCache<string>(forever);
  const siteHomes = createFreshCache<SiteHome>(forever);
  const parentSites = createFreshCache<string>(forever);
  const siteStates = createFreshCache<SiteState>();
  const publishedTrials = createFreshCache<boolean>();
  const growersInTrial = createFreshCache<boolean>();

  function trialNetwork(trialId: string): Promise<string> {
    return trialNetworks.get(trialId, async () => {
      const rows = await preparedQuery<{ network_id: string }>(
        dataSource,
        'SELECT network_id FROM trials WHERE id = $1',
        [trialId],
      );
      if (!rows[0]) throw new NotFound('Trial');
      return rows[0].network_id;
    });
  }

  interface SiteHome {
    networkId: string;
    trialId: string;
  }
  function siteHome(siteId: string): Promise<SiteHome> {
    return siteHomes.get(siteId, async () => {
      const rows = await preparedQuery<{ network_id: string; trial_id: string }>(
        dataSource,
        'SELECT t.network_id, s.trial_id FROM sites s JOIN trials t ON t.id = s.trial_id WHERE s.id = $1',
        [siteId],
      );
      if (!rows[0]) throw new NotFound('Site');
      return { networkId: rows[0].network_id, trialId: rows[0].trial_id };
    });
  }

  interface SiteState {
    growerUserId: string | null;
    published: boolean;
  }
  function siteState(siteId: string): Promise<SiteState> {
    return siteStates.get(siteId, async () => {
      const rows = await preparedQuery<{ grower_user_id: string | null; published: boolean }>(
        dataSource,
        'SELECT grower_user_id, published_at IS NOT NULL AS published FROM sites WHERE id = $1',
        [siteId],
      );
      if (!rows[0]) throw new NotFound('Site');
      return { growerUserId: rows[0].grower_user_id, published: rows[0].published };
    });
  }

  const PARENT_SITE_SQL = {
    strips: 'SELECT site_id FROM strips WHERE id = $1',
    attachments: 'SELECT site_id FROM attachments WHERE id = $1',
  };
  /** The site a strip or a photo belongs to. */
  function parentSite(
    table: keyof typeof PARENT_SITE_SQL,
    id: string,
    what: string,
  ): Promise<string> {
    return parentSites.get(`${table}:${id}`, async () => {
      const rows = await preparedQuery<{ site_id: string }>(dataSource, PARENT_SITE_SQL[table], [
        id,
      ]);
      if (!rows[0]) throw new NotFound(what);
      return rows[0].site_id;
    });
  }

  /** Whether the trial has a live published report: any scope, or only the pooled one. */
  function trialHasPublished(trialId: string, scope?: 'pooled'): Promise<boolean> {
    return publishedTrials.get(`${trialId}:${scope ?? 'any'}`, async () => {
      const rows = await dataSource.query(
        `SELECT 1 FROM report_snapshots WHERE trial_id = $1 AND ($2::text IS NULL OR scope = $2) AND withdrawn_at IS NULL LIMIT 1`,
        [trialId, scope ?? null],
      );
      return rows.length > 0;
    });
  }

  function growsInTrial(trialId: string, userId: string): Promise<boolean> {
    return growersInTrial.get(`${trialId}:${userId}`, async () => {
      const rows = await dataSource.query(
        'SELECT 1 FROM sites WHERE trial_id = $1 AND grower_user_id = $2 LIMIT 1',
        [trialId, userId],
      );
      return rows.length > 0;
    });
  }

  function policy(
    kind: PolicyKind,
    check: (req: Request) => Promise<void>,
    param?: string,
  ): Policy {
    const middleware = (req: Request, _res: Response, next: NextFunction) => {
      check(req).then(() => next(), next);
    };
    return { kind, param, middleware };
  }

  async function checkSite(
    req: Request,
    siteId: string,
    allowGrower: boolean,
    allowMemberWhenPublished: boolean,
  ) {
    const ctx = await context(req);
    const role = ctx.roles.get((await siteHome(siteId)).networkId);
    if (isCoordinating(role)) return;
    if (!role) throw new NotFound('Site');
    const site = await siteState(siteId);
    if (allowGrower && site.growerUserId === ctx.userId) return;
    if (allowMemberWhenPublished && site.published) return;
    throw new Forbidden();
  }

  return {
    public: policy('public', async () => {}),
    signedIn: policy('signed-in', async (req) => {
      await context(req);
    }),
    admin: policy('admin', async (req) => {
      const ctx = await context(req);
      if (![...ctx.roles.values()].includes('admin'))
        throw new Forbidden('Only an admin can do this');
    }),
    networkCoordinator: (param = 'networkId') =>
      policy(
        'network-coordinator',
        async (req) => {
          const ctx = await context(req);
          const networkId = uuidParam(req, param, 'Network');
          const role = ctx.roles.get(networkId);
          if (!role) throw new NotFound('Network');
          if (!isCoordinating(role))
            throw new Forbidden('Only a coordinator of this network can do this');
        },
        param,
      ),
    trialCoordinator: (param = 'trialId') =>
      policy(
        'trial-coordinator',
        async (req) => {
          const ctx = await context(req);
          const networkId = await trialNetwork(uuidParam(req, param, 'Trial'));
          const role = ctx.roles.get(networkId);
          if (!role) throw new NotFound('Trial');
          if (!isCoordinating(role))
            throw new Forbidden('Only a coordinator of this trial can do this');
        },
        param,
      ),
    /** Coordinators read everything; growers read trials they have a site in; members only once something is published. */
    trialReader: (param = 'trialId') =>
      policy(
        'trial-reader',
        async (req) => {
          const ctx = await context(req);
          const trialId = uuidParam(req, param, 'Trial');
          const networkId = await trialNetwork(trialId);
          const role = ctx.roles.get(networkId);
          if (!role) throw new NotFound('Trial');
          if (isCoordinating(role)) return;
          if (role === 'grower' && (await growsInTrial(trialId, ctx.userId))) return;
          if (await trialHasPublished(trialId)) return;
          throw new Forbidden('This trial has nothing published yet');
        },
        param,
      ),
    /** The pooled report: coordinators always; everyone else in the network once it is published. */
    pooledReader: (param = 'trialId') =>
      policy(
        'pooled-reader',
        async (req) => {
          const ctx = await context(req);
          const trialId = uuidParam(req, param, 'Trial');
          const role = ctx.roles.get(await trialNetwork(trialId));
          if (!role) throw new NotFound('Trial');
          if (isCoordinating(role)) return;
          if (!(await trialHasPublished(trialId, 'pooled')))
            throw new Forbidden('The pooled report is not published yet');
        },
        param,
      ),
    siteCoordinator: (param = 'siteId') =>
      policy(
        'site-coordinator',
        (req) => checkSite(req, uuidParam(req, param, 'Site'), false, false),
        param,
      ),
    siteGrower: (param = 'siteId') =>
      policy(
        'site-grower',
        (req) => checkSite(req, uuidParam(req, param, 'Site'), true, false),
        param,
      ),
    siteReader: (param = 'siteId') =>
      policy(
        'site-reader',
        (req) => checkSite(req, uuidParam(req, param, 'Site'), true, true),
        param,
      ),
    stripGrower: (param = 'stripId') =>
      policy(
        'strip-grower',
        async (req) => {
          const siteId = await parentSite('strips', uuidParam(req, param, 'Strip'), 'Strip');
          await checkSite(req, siteId, true, false);
        },
        param,
      ),
    attachmentReader: (param = 'attachmentId') =>
      policy(
        'attachment-reader',
        async (req) => {
          const siteId = await parentSite('attachments', uuidParam(req, param, 'Photo'), 'Photo');
          await checkSite(req, siteId, true, true);
        },
        param,
      ),
  };
}

export type Policies = ReturnType<typeof createPolicies>;
