// Site data routes: PATCH a site's dates and notes (grower or coordinator), read its history.
import { Router } from 'express';
import { UpdateSiteDataInputSchema } from '../../shared/schemas/strip';
import type { RouterContext } from '../lib/router-context';
import { secureRouter } from '../lib/route-table';
import { createSiteDataService } from './site-data.service';

export function createSiteDataRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');
  const siteData = createSiteDataService({ dataSource: ctx.dataSource });

  routes.patch('/sites/:siteId', ctx.policies.siteGrower(), async (req, res) => {
    const input = UpdateSiteDataInputSchema.parse(req.body);
    res.json(
      await siteData.updateSite(String(req.params.siteId), input, {
        userId: req.user!.id,
        roles: req.access?.roles ?? new Map(),
      }),
    );
  });

  routes.get('/sites/:siteId/audit', ctx.policies.siteCoordinator(), async (req, res) => {
    res.json(await siteData.listAudit(String(req.params.siteId)));
  });

  return router;
}
