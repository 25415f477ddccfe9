// Photo contract: a picture of a site or one of its strips, served by id.
import { z } from 'zod';

export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
/** Largest photo accepted, in bytes (phone cameras make 2–6 MB JPEGs). */
export const PHOTO_MAX_BYTES = 8 * 1024 * 1024;

export const PhotoSchema = z.object({
  id: z.uuid(),
  siteId: z.uuid(),
  stripId: z.uuid().nullable(),
  caption: z.string(),
  mimeType: z.enum(PHOTO_TYPES),
  sizeBytes: z.number().int(),
  originalName: z.string(),
  uploadedBy: z.string().nullable(),
  createdAt: z.string(),
  url: z.string(),
  /** A small JPEG preview (at most 400 px on the longest side) for lists and pages. */
  thumbnailUrl: z.string(),
});
export type PhotoDto = z.infer<typeof PhotoSchema>;

/** Text fields sent with the multipart upload (the file is field `file`). */
export const UploadPhotoFieldsSchema = z.object({
  stripId: z
    .uuid()
    .optional()
    .or(z.literal('').transform(() => undefined)),
  caption: z.string().trim().max(300, 'At most 300 characters').default(''),
});
export type UploadPhotoFields = z.infer<typeof UploadPhotoFieldsSchema>;
