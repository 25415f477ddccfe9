// PATCH /api/sites/:siteId: hand a site over, mark it lost, or choose how the farm is named.
import { Router } from 'express';
import { SiteChangeInputSchema } from '../../shared/schemas/site-change';
import { secureRouter } from '../lib/route-table';
import type { RouterContext } from '../lib/router-context';
import { createSiteChangesService } from './site-changes.service';

export function createSiteChangesRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');
  const sites = createSiteChangesService(ctx.dataSource);

  routes.patch('/sites/:siteId', ctx.policies.siteGrower(), async (req, res) => {
    const change = SiteChangeInputSchema.parse(req.body ?? {});
    res.json(
      await sites.change({
        siteId: String(req.params.siteId),
        actorUserId: req.user!.id,
        roles: req.access!.roles,
        change,
      }),
    );
  });

  return router;
}
