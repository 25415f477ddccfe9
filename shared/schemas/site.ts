// Site contract: one grower's field in one season, enrolled in a trial.
import { z } from 'zod';
import { EmailSchema } from './auth';
import { IsoDateSchema } from './common';

export { IsoDateSchema } from './common';

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

export const RandomizeInputSchema = z.object({
  /** Any text; the same seed always gives the same map. Left out, Sheaf draws a new one. */
  seed: z
    .string()
    .trim()
    .min(1, 'Give a seed or leave it out')
    .max(64, 'At most 64 characters')
    .optional(),
});
export type RandomizeInput = z.infer<typeof RandomizeInputSchema>;

/** The seeder check a grower records on a site: wheel turned over a bowl, seeds counted. */
export const CalibrationInputSchema = z.object({
  wheelCircumferenceFt: z.number().positive('Must be above 0').max(20, 'At most 20 ft'),
  turns: z
    .number()
    .int('Use a whole number of turns')
    .min(1, 'At least 1 turn')
    .max(200, 'At most 200 turns'),
  seedsCounted: z.number().int('Count whole seeds').min(0, 'At least 0').max(1_000_000),
  targetSeedsPerFt: z.number().positive('Must be above 0').max(1000),
  rowSpacingIn: z.number().positive('Must be above 0').max(40, 'At most 40 in'),
  rateLabel: z.string().trim().max(40).nullable().default(null),
  note: z.string().trim().max(1000).default(''),
});
export type CalibrationInput = z.infer<typeof CalibrationInputSchema>;

export const CalibrationRecordSchema = z.object({
  recordedAt: z.string(),
  recordedBy: z.string().nullable(),
  wheelCircumferenceFt: z.number(),
  turns: z.number(),
  seedsCounted: z.number(),
  targetSeedsPerFt: z.number(),
  deliveredSeedsPerFt: z.number(),
  percentOfTarget: z.number(),
  rateLabel: z.string().nullable(),
  note: z.string(),
});
export type CalibrationRecordDto = z.infer<typeof CalibrationRecordSchema>;

/** The trial design a site page needs to draw its map, seed weights and forms. */
export const SiteTrialContextSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  status: z.enum(['draft', 'in-field', 'harvest-in', 'closed']),
  crop: z.string().nullable(),
  cropName: z.string().nullable(),
  season: z.string().nullable(),
  unitSystem: z.enum(['imperial', 'metric']),
  referenceRate: z.number().nullable(),
  referenceUnit: z.string().nullable(),
  blocksPerSite: z.number().nullable(),
  rowsPerStrip: z.number().nullable(),
  rowSpacingIn: z.number().nullable(),
  stripLengthFt: z.number().nullable(),
  borderRows: z.number().nullable(),
  thousandKernelWeightG: z.number().nullable(),
  germinationPct: z.number().nullable(),
  emergencePct: z.number().nullable(),
  rateLevels: z.array(z.object({ id: z.uuid(), multiplier: z.number(), label: z.string() })),
});
export type SiteTrialContext = z.infer<typeof SiteTrialContextSchema>;

/** GET /api/sites/:siteId. */
export const SiteDetailSchema = z.object({
  id: z.uuid(),
  trialId: z.uuid(),
  networkId: z.uuid(),
  networkName: z.string(),
  trial: SiteTrialContextSchema,
  fieldName: z.string(),
  soil: z.string(),
  previousCrop: z.string(),
  fertility: z.string(),
  notes: z.string(),
  grower: z.object({
    userId: z.uuid().nullable(),
    name: z.string().nullable(),
    email: z.string().nullable(),
    invitationPending: z.boolean(),
  }),
  sowingDate: z.string().nullable(),
  emergenceDate: z.string().nullable(),
  headingDate: z.string().nullable(),
  harvestDate: z.string().nullable(),
  randomized: z.boolean(),
  randomizationSeed: z.string().nullable(),
  randomizedAt: z.string().nullable(),
  /** Sowing date set or any strip data entered: the map can no longer be re-randomized. */
  sowingRecorded: z.boolean(),
  stripCount: z.number(),
  calibrations: z.array(CalibrationRecordSchema),
  publishedAt: z.string().nullable(),
  dataVersion: z.number(),
  viewerRole: z.enum(['admin', 'coordinator', 'grower', 'member']),
  /** The reader is this site's grower. */
  isGrower: z.boolean(),
  /** The grower lets network reports name the farm; otherwise it shows as `reportLabel`. */
  namedInReports: z.boolean(),
  reportLabel: z.string(),
  /** Why the site gave no harvest, when a coordinator marked it lost. */
  lostReason: z.string().nullable(),
  /** When a design amendment changed this site's seed weights after its packet went out. */
  packetReissuedAt: z.string().nullable(),
  canCoordinate: z.boolean(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type SiteDetail = z.infer<typeof SiteDetailSchema>;

/** POST /api/sites/:siteId/packet/send and the trial-wide variant. */
export const PacketSendResultSchema = z.object({
  sent: z.array(z.object({ siteId: z.uuid(), to: z.string() })),
  skipped: z.array(z.object({ siteId: z.uuid(), reason: z.string() })),
});
export type PacketSendResult = z.infer<typeof PacketSendResultSchema>;
