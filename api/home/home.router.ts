// Lists for the home page: visible trials and the grower's own sites.
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import type { Policies } from '../middleware/access';
import { secureRouter, type RouteEntry } from '../lib/route-table';
import { createHomeService } from './home.service';

export function createHomeRouter(deps: {
  dataSource: DataSource;
  policies: Policies;
  table: RouteEntry[];
}) {
  const router = Router();
  const routes = secureRouter(router, deps.table, '/api');
  const home = createHomeService(deps.dataSource);

  routes.get('/trials', deps.policies.signedIn, async (req, res) => {
    res.json(await home.listTrials(req.user!.id));
  });

  routes.get('/sites/mine', deps.policies.signedIn, async (req, res) => {
    res.json(await home.listMySites(req.user!.id));
  });

  return router;
}
