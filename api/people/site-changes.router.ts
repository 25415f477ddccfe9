// PATCH /api/sites/:siteId: hand a site over, mark it lost, or choose how the farm is named.
import { Router } from 'express';
import { SITE_CHANGE_KEYS, SiteChangeInputSchema } from '../../shared/schemas/site-change';
import { secureRouter } from '../lib/route-table';
import type { RouterContext } from '../lib/router-context';
import { createSiteChangesService } from './site-changes.service';

export function createSiteChangesRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');
  const sites = createSiteChangesService(ctx.dataSource);

  // The same PATCH also carries a site's dates and notes (site-data router, mounted after this
  // one): this handler takes its own fields out of the body and passes the rest on.
  routes.patch('/sites/:siteId', ctx.policies.siteGrower(), async (req, res, next) => {
    const body = (req.body ?? {}) as Record<string, unknown>;
    const own = Object.keys(body).filter((k) => SITE_CHANGE_KEYS.includes(k));
    if (own.length === 0) return next();
    const change = SiteChangeInputSchema.parse(Object.fromEntries(own.map((k) => [k, body[k]])));
    const result = await sites.change({
      siteId: String(req.params.siteId),
      actorUserId: req.user!.id,
      roles: req.access!.roles,
      change,
    });
    const rest = Object.fromEntries(Object.entries(body).filter(([k]) => !own.includes(k)));
    if (Object.keys(rest).length === 0) return res.json(result);
    req.body = rest;
    next();
  });

  return router;
}
