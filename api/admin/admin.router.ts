// Admin-only tools; the caught-mail list exists only outside production.
import { Router } from 'express';
import { NotFound } from '../errors';
import type { MailCatcher } from '../mail/mail-catcher';
import type { Policies } from '../middleware/access';
import { secureRouter, type RouteEntry } from '../lib/route-table';

export function createAdminRouter(deps: {
  mailCatcher: MailCatcher | null;
  production: boolean;
  policies: Policies;
  table: RouteEntry[];
}) {
  const router = Router();
  const routes = secureRouter(router, deps.table, '/api/admin');
  routes.get('/mail', deps.policies.admin, (_req, res) => {
    if (deps.production || !deps.mailCatcher) throw new NotFound('Mail catcher');
    res.json(deps.mailCatcher.messages.slice(0, 200));
  });
  return router;
}
