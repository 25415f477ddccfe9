// Photos of a site or strip: checked by content (JPEG, PNG, WebP), stored under UPLOAD_DIR with
// generated names, listed per site, and read back by id.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import { PHOTO_TYPES, type PhotoDto, type UploadPhotoFields } from '../../shared/schemas/photo';
import { recordAudit } from '../audit/audit.service';
import { AppError, NotFound, ValidationError } from '../errors';
import { lockSiteForChange } from '../lib/strip-data';

const EXTENSIONS: Record<(typeof PHOTO_TYPES)[number], string> = {
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/webp': 'webp',
};

interface PhotoRow {
  id: string;
  site_id: string;
  strip_id: string | null;
  caption: string;
  mime_type: string;
  size_bytes: number;
  original_name: string;
  uploader: string | null;
  created_at: Date;
  stored_name: string;
}

function present(row: PhotoRow): PhotoDto {
  return {
    id: row.id,
    siteId: row.site_id,
    stripId: row.strip_id,
    caption: row.caption,
    mimeType: row.mime_type as PhotoDto['mimeType'],
    sizeBytes: Number(row.size_bytes),
    originalName: row.original_name,
    uploadedBy: row.uploader,
    createdAt: row.created_at.toISOString(),
    url: `/api/photos/${row.id}`,
  };
}

const SELECT = `SELECT a.*, u.name AS uploader FROM attachments a LEFT JOIN users u ON u.id = a.uploaded_by`;

export function createPhotosService(deps: { dataSource: DataSource; uploadDir: string }) {
  const { dataSource } = deps;
  const folder = path.resolve(deps.uploadDir);

  return {
    async upload(
      siteId: string,
      file: { buffer: Buffer; originalname: string },
      fields: UploadPhotoFields,
      actorUserId: string,
    ): Promise<PhotoDto> {
      const { fileTypeFromBuffer } = await import('file-type');
      const detected = await fileTypeFromBuffer(file.buffer);
      const mime = detected?.mime as (typeof PHOTO_TYPES)[number] | undefined;
      if (!mime || !PHOTO_TYPES.includes(mime)) {
        throw new AppError(
          415,
          'unsupported_media_type',
          'Only JPEG, PNG and WebP photos can be uploaded.',
        );
      }
      if (fields.stripId) {
        const rows = await dataSource.query('SELECT 1 FROM strips WHERE id = $1 AND site_id = $2', [
          fields.stripId,
          siteId,
        ]);
        if (rows.length === 0)
          throw new ValidationError('That strip is not on this site', {
            stripId: 'Not a strip of this site',
          });
      }
      fs.mkdirSync(folder, { recursive: true });
      const storedName = `${crypto.randomUUID()}.${EXTENSIONS[mime]}`;
      const target = path.join(folder, storedName);
      await fs.promises.writeFile(target, file.buffer, { flag: 'wx', mode: 0o640 });
      try {
        const id = await dataSource.transaction(async (manager) => {
          await lockSiteForChange(manager, siteId);
          const [row] = await manager.query(
            `INSERT INTO attachments (site_id, strip_id, uploaded_by, stored_name, original_name, mime_type, size_bytes, caption)
             VALUES ($1, $2, $3, $4, $5, $6, $7, $8) RETURNING id`,
            [
              siteId,
              fields.stripId ?? null,
              actorUserId,
              storedName,
              file.originalname.slice(0, 200),
              mime,
              file.buffer.length,
              fields.caption,
            ],
          );
          await recordAudit(manager, {
            actorUserId,
            entityType: 'photo',
            entityId: row.id,
            siteId,
            action: 'upload',
            after: { stripId: fields.stripId ?? null, caption: fields.caption },
          });
          return row.id as string;
        });
        const [row] = await dataSource.query(`${SELECT} WHERE a.id = $1`, [id]);
        return present(row);
      } catch (error) {
        await fs.promises.rm(target, { force: true });
        throw error;
      }
    },

    async list(siteId: string, stripId?: string): Promise<PhotoDto[]> {
      const rows: PhotoRow[] = stripId
        ? await dataSource.query(
            `${SELECT} WHERE a.site_id = $1 AND a.strip_id = $2 ORDER BY a.created_at DESC`,
            [siteId, stripId],
          )
        : await dataSource.query(`${SELECT} WHERE a.site_id = $1 ORDER BY a.created_at DESC`, [
            siteId,
          ]);
      return rows.map(present);
    },

    /** Where the photo's file is and what it is; the caller streams it. */
    async file(photoId: string): Promise<{ path: string; mimeType: string; sizeBytes: number }> {
      const [row] = await dataSource.query(
        'SELECT stored_name, mime_type, size_bytes FROM attachments WHERE id = $1',
        [photoId],
      );
      if (!row) throw new NotFound('Photo');
      const file = path.join(folder, path.basename(row.stored_name));
      if (!fs.existsSync(file)) throw new NotFound('Photo');
      return { path: file, mimeType: row.mime_type, sizeBytes: Number(row.size_bytes) };
    },
  };
}
