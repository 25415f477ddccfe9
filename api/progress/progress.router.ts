// Coordinator routes: a trial's collection progress and reminder e-mails to growers.
import { Router } from 'express';
import { SendRemindersInputSchema } from '../../shared/schemas/strip';
import type { RouterContext } from '../lib/router-context';
import { secureRouter } from '../lib/route-table';
import { createProgressService } from './progress.service';

export function createProgressRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');
  const progress = createProgressService({
    dataSource: ctx.dataSource,
    mailer: ctx.mailer,
    publicUrl: ctx.config.PUBLIC_URL,
  });

  routes.get('/trials/:trialId/progress', ctx.policies.trialCoordinator(), async (req, res) => {
    res.json(await progress.progress(String(req.params.trialId)));
  });

  routes.post('/trials/:trialId/reminders', ctx.policies.trialCoordinator(), async (req, res) => {
    const input = SendRemindersInputSchema.parse(req.body ?? {});
    res.json(await progress.sendReminders(String(req.params.trialId), input));
  });

  return router;
}
