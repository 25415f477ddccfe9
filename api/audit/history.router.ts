// GET /api/sites/:siteId/history: the site's history in plain words, for its grower and coordinators.
import { Router } from 'express';
import { secureRouter } from '../lib/route-table';
import type { RouterContext } from '../lib/router-context';
import { createHistoryService } from './history.service';

export function createHistoryRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');
  const history = createHistoryService(ctx.dataSource);

  routes.get('/sites/:siteId/history', ctx.policies.siteGrower(), async (req, res) => {
    res.json(await history.forSite(String(req.params.siteId)));
  });

  return router;
}
