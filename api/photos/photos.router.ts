// Photo routes: upload to a site (optionally one strip), list a site's photos, read one photo.
import fs from 'node:fs';
import { Router } from 'express';
import { z } from 'zod';
import { PHOTO_MAX_BYTES, UploadPhotoFieldsSchema } from '../../shared/schemas/photo';
import { ValidationError } from '../errors';
import type { RouterContext } from '../lib/router-context';
import { secureRouter } from '../lib/route-table';
import { singleFile } from '../lib/upload';
import { createPhotosService } from './photos.service';

const ListQuerySchema = z.object({ stripId: z.uuid().optional() });
const FileQuerySchema = z.object({ size: z.enum(['full', 'thumbnail']).default('full') });

export function createPhotosRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');
  const photos = createPhotosService({
    dataSource: ctx.dataSource,
    uploadDir: ctx.config.UPLOAD_DIR,
  });

  routes.post(
    '/sites/:siteId/photos',
    ctx.policies.siteGrower(),
    singleFile(PHOTO_MAX_BYTES),
    async (req, res) => {
      if (!req.file)
        throw new ValidationError('Choose a photo to upload', { file: 'Choose a photo' });
      const fields = UploadPhotoFieldsSchema.parse(req.body ?? {});
      res
        .status(201)
        .json(await photos.upload(String(req.params.siteId), req.file, fields, req.user!.id));
    },
  );

  routes.get('/sites/:siteId/photos', ctx.policies.siteReader(), async (req, res) => {
    const query = ListQuerySchema.parse(req.query);
    res.json(await photos.list(String(req.params.siteId), query.stripId));
  });

  routes.get(
    '/photos/:photoId',
    ctx.policies.attachmentReader('photoId'),
    async (req, res, next) => {
      const query = FileQuerySchema.parse(req.query);
      const file = await photos.file(String(req.params.photoId), query.size);
      res.set('Content-Type', file.mimeType);
      res.set('Content-Length', String(file.sizeBytes));
      res.set('X-Content-Type-Options', 'nosniff');
      res.set('Content-Disposition', 'inline');
      res.set('Cache-Control', 'private, max-age=86400');
      res.set('Content-Security-Policy', "default-src 'none'");
      fs.createReadStream(file.path).on('error', next).pipe(res);
    },
  );

  return router;
}
