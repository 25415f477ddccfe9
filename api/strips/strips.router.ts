// Strip routes: a site's strips with derived values, one strip, and the optimistic-lock PATCH.
import { Router, type Request } from 'express';
import { UpdateStripInputSchema } from '../../shared/schemas/strip';
import type { RouterContext } from '../lib/router-context';
import { secureRouter } from '../lib/route-table';
import { createStripsService, type Caller } from './strips.service';

export function callerOf(req: Request): Caller {
  return { userId: req.user!.id, roles: req.access?.roles ?? new Map() };
}

/** The strip of the route and its site, as the strip policy found it. */
function stripOf(req: Request) {
  return { stripId: String(req.params.stripId), siteId: req.stripSiteId! };
}

export function createStripsRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');
  const strips = createStripsService({ dataSource: ctx.dataSource });

  routes.get('/sites/:siteId/strips', ctx.policies.siteGrower(), async (req, res) => {
    res.json(await strips.listSiteStrips(String(req.params.siteId), callerOf(req)));
  });

  routes.get('/strips/:stripId', ctx.policies.stripGrower(), async (req, res) => {
    res.json(await strips.getStrip(stripOf(req)));
  });

  routes.patch('/strips/:stripId', ctx.policies.stripGrower(), async (req, res) => {
    const input = UpdateStripInputSchema.parse(req.body);
    res.json(await strips.updateStrip(stripOf(req), input, req.user!.id));
  });

  return router;
}
