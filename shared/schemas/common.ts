// Shared building blocks for the API contract: ids, roles, dates, crops, unit systems and the
// error body. Kept small: every page builds these at start-up.
import { z } from 'zod';

export const IdSchema = z.uuid();

/** A date without a time (sowing, emergence, heading, harvest): never converted through a `Date`. */
export const IsoDateSchema = z.iso.date('Use a date like 2027-04-15');

export const CROP_KEYS = [
  'wheat',
  'springWheat',
  'oats',
  'hullessOats',
  'barley',
  'rye',
  'custom',
] as const;
export const CropKeySchema = z.enum(CROP_KEYS);
export type CropKey = z.infer<typeof CropKeySchema>;

export const UNIT_SYSTEMS = ['imperial', 'metric'] as const;
export const UnitSystemSchema = z.enum(UNIT_SYSTEMS);
export type UnitSystem = z.infer<typeof UnitSystemSchema>;

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
