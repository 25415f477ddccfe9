// Trial design contract: crop, reference rate, rate levels, strip layout, seed lot and prices.
import { z } from 'zod';
import { CropKeySchema, UnitSystemSchema } from './common';

// Defined with the building blocks (pages that only need these do not build the trial schemas).
export { CROP_KEYS, CropKeySchema, UNIT_SYSTEMS, UnitSystemSchema } from './common';
export type { CropKey, UnitSystem } from './common';

export const RATE_UNITS = ['lb/acre', 'kg/ha', 'seeds/ft2', 'seeds/m2', 'seeds/ft-row'] as const;
export const RateUnitSchema = z.enum(RATE_UNITS);
export type RateUnit = z.infer<typeof RateUnitSchema>;

export const TRIAL_STATUSES = ['draft', 'in-field', 'harvest-in', 'closed'] as const;
export const TrialStatusSchema = z.enum(TRIAL_STATUSES);
export type TrialStatus = z.infer<typeof TrialStatusSchema>;

export const CustomCropSchema = z.object({
  name: z.string().trim().min(1, 'Name the crop').max(60),
  thousandKernelWeightG: z.number().positive('Must be above 0').max(100, 'At most 100 g'),
  bushelWeightLb: z.number().positive('Must be above 0').max(80, 'At most 80 lb'),
  standardMoisturePct: z.number().min(0).max(30, 'At most 30 %'),
});
export type CustomCrop = z.infer<typeof CustomCropSchema>;

export const RateLevelSchema = z.object({
  id: z.uuid().optional(),
  multiplier: z.number().positive('Must be above 0').max(10, 'At most 10× the reference'),
  label: z.string().trim().min(1, 'Give the level a label').max(40),
});
export type RateLevel = z.infer<typeof RateLevelSchema>;

export const DEFAULT_RATE_LEVELS: RateLevel[] = [
  { multiplier: 0.25, label: 'quarter' },
  { multiplier: 0.5, label: 'half' },
  { multiplier: 1, label: 'full' },
  { multiplier: 2, label: 'double' },
];

const rateLevelsSchema = z
  .array(RateLevelSchema)
  .min(2, 'Use at least 2 rate levels')
  .max(8, 'Use at most 8 rate levels')
  .refine((levels) => new Set(levels.map((l) => l.multiplier)).size === levels.length, {
    message: 'Each rate level needs a different multiplier',
  });

/** The design fields without defaults: PATCH must not fill in values the caller did not send. */
const designFields = {
  name: z.string().trim().min(1, 'Name the trial').max(120),
  question: z.string().trim().max(500),
  crop: CropKeySchema,
  customCrop: CustomCropSchema.nullable(),
  season: z.string().trim().min(4, 'Give the season, e.g. 2027').max(20),
  unitSystem: UnitSystemSchema,
  referenceRate: z.number().positive('Must be above 0').max(100000),
  referenceUnit: RateUnitSchema,
  rateLevels: rateLevelsSchema,
  blocksPerSite: z
    .number()
    .int('Use a whole number')
    .min(2, 'Use at least 2 blocks')
    .max(12, 'At most 12 blocks'),
  rowsPerStrip: z
    .number()
    .int('Use a whole number')
    .min(1, 'At least 1 row')
    .max(48, 'At most 48 rows'),
  rowSpacingIn: z.number().positive('Must be above 0').max(40, 'At most 40 in'),
  stripLengthFt: z.number().positive('Must be above 0').max(5000, 'At most 5,000 ft'),
  borderRows: z.number().int('Use a whole number').min(0, 'At least 0').max(12, 'At most 12'),
  thousandKernelWeightG: z.number().positive('Must be above 0').max(100, 'At most 100 g'),
  germinationPct: z.number().min(1, 'At least 1 %').max(100, 'At most 100 %'),
  emergencePct: z.number().min(1, 'At least 1 %').max(100, 'At most 100 %'),
  seedPricePerLb: z.number().min(0, 'At least 0').max(1000),
  grainPricePerBu: z.number().min(0, 'At least 0').max(1000),
};

/** Every field a coordinator fills in the wizard; a draft may leave most of them empty. */
export const TrialDesignSchema = z.object({
  ...designFields,
  question: designFields.question.default(''),
  customCrop: designFields.customCrop.default(null),
  unitSystem: designFields.unitSystem.default('imperial'),
  rateLevels: designFields.rateLevels.default(DEFAULT_RATE_LEVELS),
  seedPricePerLb: designFields.seedPricePerLb.default(0),
  grainPricePerBu: designFields.grainPricePerBu.default(0),
});
export type TrialDesign = z.infer<typeof TrialDesignSchema>;

/** The full design a trial needs before it goes to the field (draft → active). */
export const CompleteTrialDesignSchema = TrialDesignSchema.refine(
  (t) => t.crop !== 'custom' || t.customCrop,
  {
    message: 'A custom crop needs its kernel weight, bushel weight and moisture',
    path: ['customCrop'],
  },
);

export const CreateTrialInputSchema = TrialDesignSchema.partial()
  .extend({ name: z.string().trim().min(1, 'Name the trial').max(120), networkId: z.uuid() })
  .refine((t) => t.crop !== 'custom' || t.customCrop, {
    message: 'A custom crop needs its kernel weight, bushel weight and moisture',
    path: ['customCrop'],
  });
export type CreateTrialInput = z.infer<typeof CreateTrialInputSchema>;

/**
 * Design fields that change the seed weighed out for each strip: once any site is sown they
 * change only through an amendment with a reason (`amendReason`).
 */
export const SEED_WEIGHT_FIELDS = [
  'referenceRate',
  'referenceUnit',
  'thousandKernelWeightG',
  'germinationPct',
  'emergencePct',
  'rowsPerStrip',
  'rowSpacingIn',
  'stripLengthFt',
] as const;
export type SeedWeightField = (typeof SEED_WEIGHT_FIELDS)[number];

export const UpdateTrialInputSchema = z
  .object(designFields)
  .partial()
  .extend({
    status: TrialStatusSchema.optional(),
    /** Why a locked design field changes after sowing; shown on reports and e-mailed to growers. */
    amendReason: z
      .string()
      .trim()
      .min(5, 'Say in a few words why the design changes')
      .max(500, 'At most 500 characters')
      .optional(),
  });
export type UpdateTrialInput = z.infer<typeof UpdateTrialInputSchema>;

export const TrialSchema = z
  .object(designFields)
  .partial()
  .extend({
    id: z.uuid(),
    networkId: z.uuid(),
    networkName: z.string(),
    name: z.string(),
    status: TrialStatusSchema,
    rateLevels: z.array(RateLevelSchema.extend({ id: z.uuid() })),
    siteCount: z.number(),
    pooledPublishedAt: z.string().nullable(),
    publicLinkToken: z.string().nullable(),
    createdAt: z.string(),
    updatedAt: z.string(),
  });
export type Trial = z.infer<typeof TrialSchema>;

export const TrialSummarySchema = z.object({
  id: z.uuid(),
  networkId: z.uuid(),
  networkName: z.string(),
  name: z.string(),
  crop: CropKeySchema.nullable(),
  season: z.string().nullable(),
  status: TrialStatusSchema,
  siteCount: z.number(),
});
export type TrialSummary = z.infer<typeof TrialSummarySchema>;

/** A site as listed on its trial's page. */
export const TrialSiteRowSchema = z.object({
  id: z.uuid(),
  fieldName: z.string(),
  growerUserId: z.uuid().nullable(),
  growerName: z.string().nullable(),
  growerEmail: z.string().nullable(),
  /** True while the grower has not accepted the invitation yet. */
  invitationPending: z.boolean(),
  /** The grower lets network reports name the farm; otherwise it shows as "Farm C". */
  namedInReports: z.boolean(),
  /** The neutral label used in network reports when the farm is not named. */
  reportLabel: z.string(),
  /** At least one strip has a threshed grain weight. */
  hasYield: z.boolean(),
  /** Why the site gave no harvest, when a coordinator marked it lost. */
  lostReason: z.string().nullable(),
  /** When a design amendment changed this site's seed weights after its packet went out. */
  packetReissuedAt: z.string().nullable(),
  randomized: z.boolean(),
  randomizedAt: z.string().nullable(),
  sowingDate: z.string().nullable(),
  sowingRecorded: z.boolean(),
  stripCount: z.number(),
  publishedAt: z.string().nullable(),
});
export type TrialSiteRow = z.infer<typeof TrialSiteRowSchema>;

/** GET /api/trials/:trialId: the design, its sites (as far as the reader may see them) and what the reader may do. */
export const TrialDetailSchema = TrialSchema.extend({
  sites: z.array(TrialSiteRowSchema),
  /** The reader's role in the trial's network. */
  viewerRole: z.enum(['admin', 'coordinator', 'grower', 'member']),
  canEdit: z.boolean(),
  /** Rate levels and blocks are fixed once any site is randomized. */
  designLocked: z.boolean(),
  /** Some site is sown: the seed-weight fields change only through an amendment. */
  sowingStarted: z.boolean(),
  lockedFields: z.array(z.string()),
  /** Sites with a yield, sites marked lost, and all sites: "harvest in" when every site is one or the other. */
  harvest: z.object({ sites: z.number(), withYield: z.number(), lost: z.number() }),
  closedAt: z.string().nullable(),
  /** Only a draft can be deleted. */
  canDelete: z.boolean(),
});
export type TrialDetail = z.infer<typeof TrialDetailSchema>;

/** GET /api/trials/:trialId/people: who a coordinator can enrol as a site's grower. */
export const NetworkPersonSchema = z.object({
  userId: z.uuid(),
  name: z.string(),
  email: z.string(),
  role: z.enum(['admin', 'coordinator', 'grower', 'member']),
});
export type NetworkPerson = z.infer<typeof NetworkPersonSchema>;

/** One design amendment made after sowing: who, when, why and what changed. */
export const DesignAmendmentSchema = z.object({
  id: z.uuid(),
  at: z.string(),
  byName: z.string().nullable(),
  reason: z.string(),
  changes: z.array(z.object({ field: z.string(), from: z.unknown(), to: z.unknown() })),
  /** Sites whose packets were marked re-issued. */
  reissuedSites: z.number(),
});
export type DesignAmendment = z.infer<typeof DesignAmendmentSchema>;
