// Series routes: start and list series, read one, link a trial, and the series report.
import { Router } from 'express';
import { CreateSeriesInputSchema, LinkTrialSeriesInputSchema } from '../../shared/schemas/series';
import { secureRouter } from '../lib/route-table';
import type { RouterContext } from '../lib/router-context';
import { sendTagged } from '../lib/send-tagged';
import { createSeriesService } from './series.service';

export function createSeriesRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');
  const series = createSeriesService({ dataSource: ctx.dataSource });

  // Signed in; the service allows coordinators and admins of the chosen network only.
  routes.post('/series', ctx.policies.signedIn, async (req, res) => {
    const input = CreateSeriesInputSchema.parse(req.body);
    res.status(201).json(await series.create(req.access!, input));
  });

  routes.get('/series', ctx.policies.signedIn, async (req, res) => {
    res.json(await series.list(req.access!));
  });

  routes.get('/series/:seriesId', ctx.policies.seriesReader(), async (req, res) => {
    res.json(await series.get(String(req.params.seriesId), req.access!));
  });

  routes.get('/series/:seriesId/report', ctx.policies.seriesReader(), async (req, res) => {
    const inputs = await series.reportInputs(String(req.params.seriesId), req.access!);
    // Answer a matching If-None-Match before loading strips and fitting the model.
    if (req.get('If-None-Match') === `"${inputs.etag}"`) {
      sendTagged(req, res, { etag: inputs.etag, report: {} });
      return;
    }
    sendTagged(req, res, { etag: inputs.etag, report: await series.report(inputs, req.access!) });
  });

  routes.put('/trials/:trialId/series', ctx.policies.trialCoordinator(), async (req, res) => {
    const input = LinkTrialSeriesInputSchema.parse(req.body);
    res.json(await series.link(String(req.params.trialId), req.access!, input));
  });

  return router;
}
