// Trial routes: create (POST /api/trials), read, change and delete a trial, its design
// amendments, enrol a site, send packets.
import { Router } from 'express';
import { CreateSiteInputSchema } from '../../shared/schemas/site';
import { CreateTrialInputSchema, UpdateTrialInputSchema } from '../../shared/schemas/trial';
import { secureRouter } from '../lib/route-table';
import type { RouterContext } from '../lib/router-context';
import { createPacketsService } from '../packets/packets.service';
import { createSitesService } from '../sites/sites.service';
import { createTrialsService } from './trials.service';
import { createTrialArchiveService } from './trial-archive.service';

export function createTrialsRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');
  const trials = createTrialsService({
    dataSource: ctx.dataSource,
    invitations: ctx.invitations,
    mailer: ctx.mailer,
    publicUrl: ctx.config.PUBLIC_URL,
  });
  const sites = createSitesService({ dataSource: ctx.dataSource });
  const archives = createTrialArchiveService(ctx.dataSource);
  const packets = createPacketsService({
    dataSource: ctx.dataSource,
    mailer: ctx.mailer,
    publicUrl: ctx.config.PUBLIC_URL,
  });

  // GET /api/trials (the list) lives in the home router.
  routes.post('/trials', ctx.policies.signedIn, async (req, res) => {
    const input = CreateTrialInputSchema.parse(req.body);
    res.status(201).json(await trials.create(req.user!.id, input));
  });

  routes.get('/trials/:trialId', ctx.policies.trialReader(), async (req, res) => {
    res.json(await trials.get(String(req.params.trialId), req.user!.id));
  });

  routes.patch('/trials/:trialId', ctx.policies.trialCoordinator(), async (req, res) => {
    const input = UpdateTrialInputSchema.parse(req.body);
    res.json(await trials.update(String(req.params.trialId), req.user!.id, input));
  });

  routes.delete('/trials/:trialId', ctx.policies.trialCoordinator(), async (req, res) => {
    await trials.remove(String(req.params.trialId), req.user!.id);
    res.status(204).end();
  });

  routes.get('/trials/:trialId/amendments', ctx.policies.trialReader(), async (req, res) => {
    res.json(await trials.amendments(String(req.params.trialId)));
  });

  routes.get('/trials/:trialId/archive.zip', ctx.policies.trialCoordinator(), async (req, res) => {
    const { fileName, zip } = await archives.build(String(req.params.trialId));
    res.set('Content-Type', 'application/zip');
    res.set('Content-Disposition', `attachment; filename="${fileName}"`);
    res.set('Cache-Control', 'no-store');
    res.send(zip);
  });

  routes.get('/trials/:trialId/people', ctx.policies.trialCoordinator(), async (req, res) => {
    res.json(await trials.people(String(req.params.trialId)));
  });

  routes.post('/trials/:trialId/sites', ctx.policies.trialCoordinator(), async (req, res) => {
    const input = CreateSiteInputSchema.parse(req.body);
    const { siteId, invitation } = await trials.enrolSite(
      String(req.params.trialId),
      req.user!.id,
      input,
    );
    res.status(201).json({ ...(await sites.get(siteId, req.user!.id)), invitation });
  });

  routes.post(
    '/trials/:trialId/packets/send',
    ctx.policies.trialCoordinator(),
    async (req, res) => {
      res.json(await packets.sendForTrial(String(req.params.trialId), req.user!.id));
    },
  );

  return router;
}
