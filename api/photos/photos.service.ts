// Photos of a site or strip: checked by content (JPEG, PNG, WebP), re-encoded without location
// or camera metadata (turned upright first), stored under UPLOAD_DIR with generated names and a
// small preview, listed per site, and read back by id.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';
import type { DataSource } from 'typeorm';
import { Attachment } from '../../db/entities/attachment.entity';
import { Strip } from '../../db/entities/strip.entity';
import { User } from '../../db/entities/user.entity';
import { PHOTO_TYPES, type PhotoDto, type UploadPhotoFields } from '../../shared/schemas/photo';
import { recordAudit } from '../audit/audit.service';
import { AppError, NotFound, ValidationError } from '../errors';
import { lockSiteForChange } from '../lib/strip-data';

type PhotoType = (typeof PHOTO_TYPES)[number];

const EXTENSIONS: Record<PhotoType, string> = {
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/webp': 'webp',
};
/** Longest side of a preview, in pixels: sharp on a 3× phone screen at about 130 CSS px. */
export const THUMBNAIL_SIZE = 400;

function present(row: Attachment, uploader: string | null): PhotoDto {
  return {
    id: row.id,
    siteId: row.siteId,
    stripId: row.stripId,
    caption: row.caption,
    mimeType: row.mimeType as PhotoDto['mimeType'],
    sizeBytes: Number(row.sizeBytes),
    originalName: row.originalName,
    uploadedBy: uploader,
    createdAt: row.createdAt.toISOString(),
    url: `/api/photos/${row.id}`,
    thumbnailUrl: row.thumbnailName
      ? `/api/photos/${row.id}?size=thumbnail`
      : `/api/photos/${row.id}`,
  };
}

/**
 * The photo turned upright by its EXIF orientation and written again with no metadata (no GPS
 * position, camera serial or time) except its colour profile, plus a small JPEG preview.
 */
async function cleanPhoto(buffer: Buffer, mime: PhotoType) {
  const upright = () => sharp(buffer, { failOn: 'none' }).rotate().keepIccProfile();
  const full =
    mime === 'image/jpeg'
      ? upright().jpeg({ quality: 90, mozjpeg: true })
      : mime === 'image/png'
        ? upright().png()
        : upright().webp({ quality: 90 });
  const thumbnail = upright()
    .resize({
      width: THUMBNAIL_SIZE,
      height: THUMBNAIL_SIZE,
      fit: 'inside',
      withoutEnlargement: true,
    })
    .flatten({ background: '#ffffff' })
    .jpeg({ quality: 75 });
  try {
    const [photo, preview] = await Promise.all([full.toBuffer(), thumbnail.toBuffer()]);
    return { photo, preview };
  } catch {
    throw new ValidationError('This picture could not be read; it may be damaged', {
      file: 'unreadable image',
    });
  }
}

/** Writes a whole file or nothing: a failed write (disk full) removes what was written. */
async function writeWhole(target: string, data: Buffer): Promise<void> {
  try {
    await fs.promises.writeFile(target, data, { flag: 'wx', mode: 0o640 });
  } catch (error) {
    await fs.promises.rm(target, { force: true });
    if (
      (error as { code?: string }).code === 'ENOSPC' ||
      (error as { code?: string }).code === 'EDQUOT'
    )
      throw new AppError(
        507,
        'insufficient_storage',
        'The server has no room to store this photo; nothing was saved. Tell the network admin.',
      );
    throw error;
  }
}

export function createPhotosService(deps: { dataSource: DataSource; uploadDir: string }) {
  const { dataSource } = deps;
  const folder = path.resolve(deps.uploadDir);
  const attachments = dataSource.getRepository(Attachment);

  async function findWithUploader(where: { siteId: string; stripId?: string } | { id: string }) {
    const query = attachments
      .createQueryBuilder('a')
      .leftJoin(User, 'u', 'u.id = a.uploadedBy')
      .addSelect('u.name', 'uploader')
      .orderBy('a.createdAt', 'DESC');
    if ('id' in where) query.where('a.id = :id', { id: where.id });
    else {
      query.where('a.siteId = :siteId', { siteId: where.siteId });
      if (where.stripId) query.andWhere('a.stripId = :stripId', { stripId: where.stripId });
    }
    const { entities, raw } = await query.getRawAndEntities<{ uploader: string | null }>();
    return entities.map((row, i) => present(row, raw[i]?.uploader ?? null));
  }

  return {
    async upload(
      siteId: string,
      file: { buffer: Buffer; originalname: string },
      fields: UploadPhotoFields,
      actorUserId: string,
    ): Promise<PhotoDto> {
      const { fileTypeFromBuffer } = await import('file-type');
      const detected = await fileTypeFromBuffer(file.buffer);
      const mime = detected?.mime as PhotoType | undefined;
      if (!mime || !PHOTO_TYPES.includes(mime)) {
        throw new AppError(
          415,
          'unsupported_media_type',
          'Only JPEG, PNG and WebP photos can be uploaded.',
        );
      }
      if (fields.stripId) {
        const strip = await dataSource
          .getRepository(Strip)
          .existsBy({ id: fields.stripId, siteId });
        if (!strip)
          throw new ValidationError('That strip is not on this site', {
            stripId: 'Not a strip of this site',
          });
      }
      const { photo, preview } = await cleanPhoto(file.buffer, mime);
      await fs.promises.mkdir(folder, { recursive: true });
      const base = crypto.randomUUID();
      const storedName = `${base}.${EXTENSIONS[mime]}`;
      const thumbnailName = `${base}.thumbnail.jpg`;
      const written: string[] = [];
      try {
        for (const [name, data] of [
          [storedName, photo],
          [thumbnailName, preview],
        ] as const) {
          const target = path.join(folder, name);
          await writeWhole(target, data);
          written.push(target);
        }
        const id = await dataSource.transaction(async (manager) => {
          await lockSiteForChange(manager, siteId);
          const row = await manager.getRepository(Attachment).save(
            manager.getRepository(Attachment).create({
              siteId,
              stripId: fields.stripId ?? null,
              uploadedBy: actorUserId,
              storedName,
              thumbnailName,
              originalName: file.originalname.slice(0, 200),
              mimeType: mime,
              sizeBytes: photo.length,
              caption: fields.caption,
            }),
          );
          await recordAudit(manager, {
            actorUserId,
            entityType: 'photo',
            entityId: row.id,
            siteId,
            action: 'upload',
            after: { stripId: fields.stripId ?? null, caption: fields.caption },
          });
          return row.id;
        });
        const [stored] = await findWithUploader({ id });
        return stored!;
      } catch (error) {
        await Promise.all(written.map((target) => fs.promises.rm(target, { force: true })));
        throw error;
      }
    },

    list(siteId: string, stripId?: string): Promise<PhotoDto[]> {
      return findWithUploader({ siteId, stripId });
    },

    /** Where the photo's file (or its preview) is and what it is; the caller streams it. */
    async file(
      photoId: string,
      size: 'full' | 'thumbnail' = 'full',
    ): Promise<{ path: string; mimeType: string; sizeBytes: number }> {
      const row = await attachments.findOneBy({ id: photoId });
      if (!row) throw new NotFound('Photo');
      const name = size === 'thumbnail' && row.thumbnailName ? row.thumbnailName : row.storedName;
      const file = path.join(folder, path.basename(name));
      const stat = await fs.promises.stat(file).catch(() => null);
      if (!stat) throw new NotFound('Photo');
      return {
        path: file,
        mimeType: name === row.thumbnailName ? 'image/jpeg' : row.mimeType,
        sizeBytes: stat.size,
      };
    },
  };
}
