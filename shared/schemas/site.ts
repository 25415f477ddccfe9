// Site contract: one grower's field in one season, enrolled in a trial.
import { z } from 'zod';
import { EmailSchema } from './auth';

export const IsoDateSchema = z.iso.date('Use a date like 2027-04-15');

export const CreateSiteInputSchema = z
  .object({
    growerUserId: z.uuid().optional(),
    growerEmail: EmailSchema.optional(),
    fieldName: z.string().trim().min(1, 'Name the field').max(120),
    soil: z.string().trim().max(120).default(''),
    previousCrop: z.string().trim().max(120).default(''),
    fertility: z.string().trim().max(500).default(''),
    notes: z.string().trim().max(4000).default(''),
  })
  .refine((s) => s.growerUserId || s.growerEmail, {
    message: 'Choose a grower or enter their e-mail address',
    path: ['growerEmail'],
  });
export type CreateSiteInput = z.infer<typeof CreateSiteInputSchema>;

export const UpdateSiteInputSchema = z.object({
  fieldName: z.string().trim().min(1).max(120).optional(),
  soil: z.string().trim().max(120).optional(),
  previousCrop: z.string().trim().max(120).optional(),
  fertility: z.string().trim().max(500).optional(),
  notes: z.string().trim().max(4000).optional(),
  sowingDate: IsoDateSchema.nullable().optional(),
  emergenceDate: IsoDateSchema.nullable().optional(),
  headingDate: IsoDateSchema.nullable().optional(),
  harvestDate: IsoDateSchema.nullable().optional(),
});
export type UpdateSiteInput = z.infer<typeof UpdateSiteInputSchema>;

export const SiteSummarySchema = z.object({
  id: z.uuid(),
  trialId: z.uuid(),
  trialName: z.string(),
  crop: z.string().nullable(),
  season: z.string().nullable(),
  fieldName: z.string(),
  growerName: z.string().nullable(),
  growerEmail: z.string().nullable(),
  randomized: z.boolean(),
  stripCount: z.number(),
  stripsWithYield: z.number(),
  publishedAt: z.string().nullable(),
});
export type SiteSummary = z.infer<typeof SiteSummarySchema>;
