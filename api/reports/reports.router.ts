// Report routes: site and pooled reports, publishing, the public link and the exports.
import { Router, type Request } from 'express';
import { z } from 'zod';
import { PooledQuerySchema, PublicLinkInputSchema } from '../../shared/schemas/report';
import { NotFound } from '../errors';
import { secureRouter } from '../lib/route-table';
import { sendTagged } from '../lib/send-tagged';
import type { RouterContext } from '../lib/router-context';
import { pooledReportPdf, siteReportPdf } from './reports.pdf';
import { createReportsService } from './reports.service';
import { createReportPrivacy } from '../lib/report-privacy';

const param = (req: Request, name: string) => String(req.params[name]);
const fileName = (text: string) =>
  text
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '') || 'report';

export function createReportsRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');
  const { policies } = ctx;
  const reports = createReportsService({
    dataSource: ctx.dataSource,
    mailer: ctx.mailer,
    publicUrl: ctx.config.PUBLIC_URL,
  });
  // Growers' privacy applies to every report body this router sends (see report-privacy.ts).
  const privacy = createReportPrivacy(ctx.dataSource);

  routes.get('/sites/:siteId/report', policies.siteReader(), async (req, res) => {
    sendTagged(
      req,
      res,
      await privacy.tagged(
        await reports.siteReport(param(req, 'siteId'), req.access ?? null, req.siteRead),
        req.access,
        req.siteRead?.trial?.networkId,
      ),
    );
  });

  routes.get('/sites/:siteId/report.pdf', policies.siteReader(), async (req, res) => {
    const { report, etag } = await privacy.tagged(
      await reports.siteReport(param(req, 'siteId'), req.access ?? null, req.siteRead),
      req.access,
      req.siteRead?.trial?.networkId,
    );
    const pdf = await siteReportPdf(report, etag, ctx.dataSource);
    res.set('Content-Type', 'application/pdf');
    res.set(
      'Content-Disposition',
      `attachment; filename="${fileName(report.site.fieldName)}-site-report.pdf"`,
    );
    res.send(pdf);
  });

  routes.post('/sites/:siteId/publish', policies.siteCoordinator(), async (req, res) => {
    const { report, mailed } = await reports.publishSite(param(req, 'siteId'), req.user!.id);
    res.set('X-Sheaf-Grower-Mailed', mailed ? 'yes' : 'no');
    res.json(report);
  });

  routes.post('/sites/:siteId/unpublish', policies.siteCoordinator(), async (req, res) => {
    res.json(await reports.unpublishSite(param(req, 'siteId'), req.user!.id));
  });

  routes.get('/trials/:trialId/pooled-report', policies.pooledReader(), async (req, res) => {
    const query = PooledQuerySchema.parse(req.query);
    sendTagged(
      req,
      res,
      await privacy.tagged(
        await reports.pooledReport(param(req, 'trialId'), req.access ?? null, query),
        req.access,
        req.trialNetworkId,
      ),
    );
  });

  routes.get('/trials/:trialId/pooled-report.pdf', policies.pooledReader(), async (req, res) => {
    const query = PooledQuerySchema.parse(req.query);
    const { report, etag } = await privacy.tagged(
      await reports.pooledReport(param(req, 'trialId'), req.access ?? null, query),
      req.access,
      req.trialNetworkId,
    );
    const pdf = await pooledReportPdf(report, etag, ctx.dataSource);
    res.set('Content-Type', 'application/pdf');
    res.set(
      'Content-Disposition',
      `attachment; filename="${fileName(report.trial.name)}-network-report.pdf"`,
    );
    res.send(pdf);
  });

  routes.post('/trials/:trialId/publish', policies.trialCoordinator(), async (req, res) => {
    res.json(await reports.publishTrial(param(req, 'trialId'), req.user!.id));
  });

  routes.post('/trials/:trialId/unpublish', policies.trialCoordinator(), async (req, res) => {
    res.json(await reports.unpublishTrial(param(req, 'trialId'), req.user!.id));
  });

  routes.post('/trials/:trialId/public-link', policies.trialCoordinator(), async (req, res) => {
    const input = PublicLinkInputSchema.parse(req.body);
    res.json(await reports.setPublicLink(param(req, 'trialId'), input.enabled, req.user!.id));
  });

  routes.get('/public/reports/:token', policies.public, async (req, res) => {
    const token = z
      .string()
      .min(16)
      .max(100)
      .regex(/^[A-Za-z0-9_-]+$/)
      .safeParse(req.params.token);
    const query = PooledQuerySchema.parse(req.query);
    if (!token.success) throw new NotFound('Report');
    res.set('Cache-Control', 'no-store');
    res.set('X-Robots-Tag', 'noindex');
    res.json(
      await privacy.pooledReport((await reports.publicReport(token.data, query)).report, null),
    );
  });

  routes.get('/trials/:trialId/export.csv', policies.trialCoordinator(), async (req, res) => {
    const { fileName: name, csv } = await reports.exportCsv(param(req, 'trialId'));
    res.set('Content-Type', 'text/csv; charset=utf-8');
    res.set('Content-Disposition', `attachment; filename="${name}"`);
    res.send(`\uFEFF${csv}`);
  });

  return router;
}
