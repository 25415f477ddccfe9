// Strip contract for data collection: a site's strips with their values, derived numbers and
// warnings; the partial update a form or grid sends; site dates; audit and progress rows.
import { z } from 'zod';
import { CropKeySchema, IsoDateSchema, UnitSystemSchema } from './common';
import { DerivedValuesSchema, ObservationValuesSchema } from './observation';

/** Groups of measurements a strip can have "in"; each is complete or missing. */
export const MEASUREMENT_GROUPS = ['stand', 'tillers', 'heads', 'yield'] as const;
export const MeasurementGroupSchema = z.enum(MEASUREMENT_GROUPS);
export type MeasurementGroup = z.infer<typeof MeasurementGroupSchema>;

export const MEASUREMENT_GROUP_NAMES: Record<MeasurementGroup, string> = {
  stand: 'Stand count',
  tillers: 'Tillers',
  heads: 'Heads',
  yield: 'Grain weight and moisture',
};

export const RecordedSchema = z.object({
  stand: z.boolean(),
  tillers: z.boolean(),
  heads: z.boolean(),
  yield: z.boolean(),
});
export type Recorded = z.infer<typeof RecordedSchema>;

export const StripSchema = z.object({
  stripId: z.uuid(),
  siteId: z.uuid(),
  block: z.number().int(),
  position: z.number().int(),
  /** Plot number, unique within the site: block × 100 + position. */
  plotNumber: z.number().int(),
  rateLevelId: z.uuid(),
  /** Multiplier of the reference rate. */
  rate: z.number(),
  label: z.string(),
  version: z.number().int(),
  values: ObservationValuesSchema,
  derived: DerivedValuesSchema,
  warnings: z.array(z.string()),
  recorded: RecordedSchema,
  updatedAt: z.string().nullable(),
});
export type StripDto = z.infer<typeof StripSchema>;

export const SiteDatesSchema = z.object({
  sowingDate: IsoDateSchema.nullable(),
  emergenceDate: IsoDateSchema.nullable(),
  headingDate: IsoDateSchema.nullable(),
  harvestDate: IsoDateSchema.nullable(),
});
export type SiteDates = z.infer<typeof SiteDatesSchema>;

/** What a collection page needs to know about the site and its trial. */
export const SiteContextSchema = SiteDatesSchema.extend({
  siteId: z.uuid(),
  trialId: z.uuid(),
  trialName: z.string(),
  fieldName: z.string(),
  growerName: z.string().nullable(),
  notes: z.string(),
  unitSystem: UnitSystemSchema,
  crop: CropKeySchema.nullable(),
  cropName: z.string().nullable(),
  standardMoisturePercent: z.number().nullable(),
  bushelPounds: z.number().nullable(),
  rateLevels: z.array(z.object({ id: z.uuid(), multiplier: z.number(), label: z.string() })),
  blocksPerSite: z.number().nullable(),
  rowsPerStrip: z.number().nullable(),
  rowSpacingIn: z.number().nullable(),
  stripLengthFt: z.number().nullable(),
  thousandKernelWeightG: z.number().nullable(),
  referenceRate: z.number().nullable(),
  referenceUnit: z.string().nullable(),
  seedPricePerLb: z.number().nullable(),
  grainPricePerBu: z.number().nullable(),
  publishedAt: z.string().nullable(),
  dataVersion: z.number().int(),
  /** Whether the caller may change data (grower of the site or coordinator, and not published). */
  canEdit: z.boolean(),
  /** Whether the caller coordinates the trial (sees history, progress). */
  isCoordinator: z.boolean(),
});
export type SiteContext = z.infer<typeof SiteContextSchema>;

export const SiteStripsSchema = z.object({
  site: SiteContextSchema,
  strips: z.array(StripSchema),
});
export type SiteStrips = z.infer<typeof SiteStripsSchema>;

export const StripValuesPatchSchema = ObservationValuesSchema.partial();
export type StripValuesPatch = z.infer<typeof StripValuesPatchSchema>;

export const UpdateStripInputSchema = z.object({
  /** The version the edit was made on; a stale one gets 409 with the current strip. */
  version: z.number().int().min(1),
  values: StripValuesPatchSchema,
});
export type UpdateStripInput = z.infer<typeof UpdateStripInputSchema>;

/** PATCH /api/sites/:siteId: dates that apply to every strip, and the site's notes. */
export const UpdateSiteDataInputSchema = SiteDatesSchema.partial().extend({
  notes: z.string().max(4000, 'At most 4,000 characters').optional(),
});
export type UpdateSiteDataInput = z.infer<typeof UpdateSiteDataInputSchema>;

export const AuditEventSchema = z.object({
  id: z.uuid(),
  createdAt: z.string(),
  actorName: z.string().nullable(),
  actorEmail: z.string().nullable(),
  entityType: z.string(),
  entityId: z.uuid(),
  action: z.string(),
  /** Block and position of the strip, when the event is about a strip. */
  strip: z.object({ block: z.number(), position: z.number(), label: z.string() }).nullable(),
  before: z.record(z.string(), z.unknown()).nullable(),
  after: z.record(z.string(), z.unknown()).nullable(),
});
export type AuditEventDto = z.infer<typeof AuditEventSchema>;

export const SiteProgressSchema = z.object({
  siteId: z.uuid(),
  fieldName: z.string(),
  growerName: z.string().nullable(),
  growerEmail: z.string().nullable(),
  stripCount: z.number().int(),
  /** Strips with each measurement group in. */
  recorded: z.object({
    stand: z.number().int(),
    tillers: z.number().int(),
    heads: z.number().int(),
    yield: z.number().int(),
  }),
  dates: SiteDatesSchema,
  publishedAt: z.string().nullable(),
  lastChangeAt: z.string().nullable(),
});
export type SiteProgress = z.infer<typeof SiteProgressSchema>;

export const TrialProgressSchema = z.object({
  trialId: z.uuid(),
  trialName: z.string(),
  sites: z.array(SiteProgressSchema),
});
export type TrialProgress = z.infer<typeof TrialProgressSchema>;

export const SendRemindersInputSchema = z.object({
  /** Only these sites (default: every site with something missing). */
  siteIds: z.array(z.uuid()).optional(),
  /** Only ask about these groups (default: all). */
  groups: z.array(MeasurementGroupSchema).min(1).optional(),
  message: z.string().trim().max(1000).optional(),
});
export type SendRemindersInput = z.infer<typeof SendRemindersInputSchema>;

export const RemindersResultSchema = z.object({
  sent: z.array(z.object({ siteId: z.uuid(), to: z.string() })),
  skipped: z.array(z.object({ siteId: z.uuid(), reason: z.string() })),
});
export type RemindersResult = z.infer<typeof RemindersResultSchema>;
