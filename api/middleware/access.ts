// Access policies: who may call a route, decided from the session user and their memberships.
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/schemas/common';
import { Forbidden, NotFound, Unauthenticated } from '../errors';
import { IsNull } from 'typeorm';
import { Attachment } from '../../db/entities/attachment.entity';
import { Membership } from '../../db/entities/membership.entity';
import { ReportSnapshot } from '../../db/entities/report-snapshot.entity';
import { Site } from '../../db/entities/site.entity';
import { Strip } from '../../db/entities/strip.entity';
import { Trial } from '../../db/entities/trial.entity';
import { TrialSeries } from '../../db/entities/trial-series.entity';
import { findSiteWithDesign } from '../lib/strip-data';

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
  | 'attachment-reader'
  | 'series-reader';

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
    /**
     * The site (with its trial, rate levels and grower) as a site policy read it for this request,
     * so a read-only handler need not read it again. Writes read and lock it themselves.
     */
    siteRead?: Site;
    /** The network of the trial a trial policy checked for this request. */
    trialNetworkId?: string;
    /** The site of the strip a strip policy checked for this request. */
    stripSiteId?: string;
  }
}

export function isCoordinating(role: Role | undefined): boolean {
  return role !== undefined && COORDINATING.includes(role);
}

/**
 * Whether the caller grows this site now: they are its grower and still hold the grower role in
 * its network (a grower changed to member keeps their name on the site but loses write access).
 */
export function growsSite(
  role: Role | undefined,
  growerUserId: string | null,
  userId: string,
): boolean {
  return role === 'grower' && growerUserId !== null && growerUserId === userId;
}

/**
 * Builds the policies against one DataSource. Every check reads PostgreSQL afresh, so a role
 * change, a removal or a publish applies to the very next request on every server process.
 */
export function createPolicies(dataSource: DataSource) {
  async function context(req: Request): Promise<AccessContext> {
    const userId = req.user?.id;
    if (!userId) throw new Unauthenticated();
    if (req.access) return req.access;
    const memberships = await dataSource.getRepository(Membership).find({
      select: { networkId: true, role: true },
      where: { userId },
    });
    req.access = { userId, roles: new Map(memberships.map((m) => [m.networkId, m.role])) };
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

  async function trialNetwork(req: Request, trialId: string): Promise<string> {
    const trial = await dataSource
      .getRepository(Trial)
      .findOne({ select: { id: true, networkId: true }, where: { id: trialId } });
    if (!trial) throw new NotFound('Trial');
    req.trialNetworkId = trial.networkId;
    return trial.networkId;
  }

  interface SiteFacts {
    networkId: string;
    growerUserId: string | null;
    published: boolean;
  }
  /**
   * What the access check needs of a site. For reads (`keep`) it reads the site with its design
   * and keeps it on the request, so the handler need not read it again; writes get the small
   * read, since they lock and read the site themselves.
   */
  async function siteFacts(req: Request, siteId: string, keep: boolean): Promise<SiteFacts> {
    const site = keep
      ? await findSiteWithDesign(dataSource.manager, siteId)
      : await dataSource
          .getRepository(Site)
          .createQueryBuilder('site')
          .innerJoin('site.trial', 'trial')
          .select([
            'site.id',
            'site.growerUserId',
            'site.publishedAt',
            'trial.id',
            'trial.networkId',
          ])
          .where('site.id = :siteId', { siteId })
          .getOne();
    if (!site?.trial) throw new NotFound('Site');
    if (keep) req.siteRead = site;
    return {
      networkId: site.trial!.networkId,
      growerUserId: site.growerUserId,
      published: site.publishedAt !== null,
    };
  }

  /** The site a photo belongs to. */
  async function photoSite(attachmentId: string): Promise<string> {
    const row = await dataSource
      .getRepository(Attachment)
      .findOne({ select: { id: true, siteId: true }, where: { id: attachmentId } });
    if (!row) throw new NotFound('Photo');
    return row.siteId;
  }

  /** Whether the trial has a live published report: any scope, or only the pooled one. */
  function trialHasPublished(trialId: string, scope?: 'pooled'): Promise<boolean> {
    return dataSource
      .getRepository(ReportSnapshot)
      .exists({ where: { trialId, withdrawnAt: IsNull(), ...(scope ? { scope } : {}) } });
  }

  function growsInTrial(trialId: string, userId: string): Promise<boolean> {
    return dataSource.getRepository(Site).exists({ where: { trialId, growerUserId: userId } });
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
    /** Keep the site with its design on the request (read handlers that use it). */
    keep = false,
  ) {
    const [ctx, site] = await Promise.all([context(req), siteFacts(req, siteId, keep)]);
    decideSite(ctx, site, allowGrower, allowMemberWhenPublished);
  }

  function decideSite(
    ctx: AccessContext,
    site: SiteFacts,
    allowGrower: boolean,
    allowMemberWhenPublished: boolean,
  ) {
    const role = ctx.roles.get(site.networkId);
    if (isCoordinating(role)) return;
    if (!role) throw new NotFound('Site');
    if (allowGrower && growsSite(role, site.growerUserId, ctx.userId)) return;
    if (allowMemberWhenPublished && site.published) return;
    throw new Forbidden();
  }

  /**
   * A strip's site facts in one query (a strip change is the busiest write); the site's id is
   * kept on the request so the handler need not look it up again.
   */
  async function stripSiteFacts(req: Request, stripId: string): Promise<SiteFacts> {
    const strip = await dataSource
      .getRepository(Strip)
      .createQueryBuilder('strip')
      .innerJoin('strip.site', 'site')
      .innerJoin('site.trial', 'trial')
      .select([
        'strip.id',
        'strip.siteId',
        'site.id',
        'site.growerUserId',
        'site.publishedAt',
        'trial.id',
        'trial.networkId',
      ])
      .where('strip.id = :stripId', { stripId })
      .getOne();
    if (!strip?.site?.trial) throw new NotFound('Strip');
    req.stripSiteId = strip.siteId;
    return {
      networkId: strip.site.trial.networkId,
      growerUserId: strip.site.growerUserId,
      published: strip.site.publishedAt !== null,
    };
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
          const networkId = await trialNetwork(req, uuidParam(req, param, 'Trial'));
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
          const networkId = await trialNetwork(req, trialId);
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
          const role = ctx.roles.get(await trialNetwork(req, trialId));
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
        (req) => checkSite(req, uuidParam(req, param, 'Site'), true, true, true),
        param,
      ),
    stripGrower: (param = 'stripId') =>
      policy(
        'strip-grower',
        async (req) => {
          const stripId = uuidParam(req, param, 'Strip');
          const [ctx, site] = await Promise.all([context(req), stripSiteFacts(req, stripId)]);
          decideSite(ctx, site, true, false);
        },
        param,
      ),
    /** A series: everyone in its network reads it (the report itself limits what each reader sees). */
    seriesReader: (param = 'seriesId') =>
      policy(
        'series-reader',
        async (req) => {
          const ctx = await context(req);
          const series = await dataSource.getRepository(TrialSeries).findOne({
            select: { id: true, networkId: true },
            where: { id: uuidParam(req, param, 'Series') },
          });
          if (!series || !ctx.roles.has(series.networkId)) throw new NotFound('Series');
        },
        param,
      ),
    attachmentReader: (param = 'attachmentId') =>
      policy(
        'attachment-reader',
        async (req) => {
          const siteId = await photoSite(uuidParam(req, param, 'Photo'));
          await checkSite(req, siteId, true, true);
        },
        param,
      ),
  };
}

export type Policies = ReturnType<typeof createPolicies>;
