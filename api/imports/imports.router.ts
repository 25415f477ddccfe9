// CSV routes: the site's template (prefilled) and the multipart upload (field `file`, 5 MB).
import { Router } from 'express';
import { IMPORT_MAX_BYTES } from '../../shared/schemas/import';
import { ValidationError } from '../errors';
import type { RouterContext } from '../lib/router-context';
import { secureRouter } from '../lib/route-table';
import { singleFile } from '../lib/upload';
import { createImportsService, csvText } from './imports.service';

export function createImportsRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');
  const imports = createImportsService({ dataSource: ctx.dataSource });

  // The export is the template with every stored value: a grower edits it in a spreadsheet and
  // uploads it unchanged or changed; the same columns go both ways.
  for (const [path, kind] of [
    ['/sites/:siteId/import-template.csv', 'strips'],
    ['/sites/:siteId/export.csv', 'export'],
  ] as const) {
    routes.get(path, ctx.policies.siteGrower(), async (req, res) => {
      const { fileName, csv } = await imports.template(String(req.params.siteId), kind);
      res.set('Content-Type', 'text/csv; charset=utf-8');
      res.set('Content-Disposition', `attachment; filename="${fileName}"`);
      res.set('Cache-Control', 'no-store');
      res.send(`\uFEFF${csv}\r\n`);
    });
  }

  routes.post(
    '/sites/:siteId/import',
    ctx.policies.siteGrower(),
    singleFile(IMPORT_MAX_BYTES),
    async (req, res) => {
      if (!req.file)
        throw new ValidationError('Choose a CSV file to upload', { file: 'Choose a CSV file' });
      const text = await csvText(req.file.buffer, req.file.mimetype);
      res.json(await imports.importCsv(String(req.params.siteId), text, req.user!.id));
    },
  );

  return router;
}
