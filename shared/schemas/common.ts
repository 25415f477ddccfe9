// Shared building blocks for the API contract: ids, roles and the error body.
import { z } from 'zod';

export const IdSchema = z.uuid();

export const ROLES = ['admin', 'coordinator', 'grower', 'member'] as const;
export const RoleSchema = z.enum(ROLES);
export type Role = z.infer<typeof RoleSchema>;

export const ERROR_CODES = [
  'validation_failed',
  'unauthenticated',
  'forbidden',
  'not_found',
  'conflict',
  'locked',
  'design_locked',
  'invalid_rows',
  'payload_too_large',
  'unsupported_media_type',
  'rate_limited',
  'insufficient_storage',
  'service_unavailable',
  'internal_error',
] as const;
export type ErrorCode = (typeof ERROR_CODES)[number];

/** The one error body every failing API response carries. */
export const ApiErrorBodySchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
    rows: z
      .array(z.object({ row: z.number(), column: z.string(), message: z.string() }))
      .optional(),
    current: z.unknown().optional(),
  }),
});
export type ApiErrorBody = z.infer<typeof ApiErrorBodySchema>;
