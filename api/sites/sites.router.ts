// Site routes owned by trial design: site detail, randomization, strip layout, calibrations, packet e-mail.
import { Router } from 'express';
import { CalibrationInputSchema, RandomizeInputSchema } from '../../shared/schemas/site';
import { secureRouter } from '../lib/route-table';
import type { RouterContext } from '../lib/router-context';
import { createPacketsService } from '../packets/packets.service';
import { createSitesService } from './sites.service';
import { createReportPrivacy } from '../lib/report-privacy';

export function createSitesRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');
  const sites = createSitesService({ dataSource: ctx.dataSource });
  const privacy = createReportPrivacy(ctx.dataSource);
  const packets = createPacketsService({
    dataSource: ctx.dataSource,
    mailer: ctx.mailer,
    publicUrl: ctx.config.PUBLIC_URL,
  });

  routes.get('/sites/:siteId', ctx.policies.siteReader(), async (req, res) => {
    const detail = await sites.get(String(req.params.siteId), req.user!.id, req.siteRead);
    res.json(await privacy.siteDetail(detail, req.access));
  });

  routes.post('/sites/:siteId/randomize', ctx.policies.siteCoordinator(), async (req, res) => {
    const input = RandomizeInputSchema.parse(req.body ?? {});
    res.json(await sites.randomize(String(req.params.siteId), req.user!.id, input.seed));
  });

  routes.get('/sites/:siteId/layout', ctx.policies.siteReader(), async (req, res) => {
    res.json(await sites.layout(String(req.params.siteId), req.siteRead));
  });

  routes.post('/sites/:siteId/calibrations', ctx.policies.siteGrower(), async (req, res) => {
    const input = CalibrationInputSchema.parse(req.body);
    res.status(201).json({
      calibrations: await sites.addCalibration(String(req.params.siteId), req.user!.id, input),
    });
  });

  routes.post('/sites/:siteId/packet/send', ctx.policies.siteCoordinator(), async (req, res) => {
    res.json(await packets.sendForSite(String(req.params.siteId)));
  });

  return router;
}
