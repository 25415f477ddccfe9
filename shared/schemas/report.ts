// Report contract: the site report, the pooled network report, publishing and the public link.
import { z } from 'zod';
import type { PooledAnalysis, SiteAnalysis } from '../analysis/types';
import { UnitSystemSchema } from './trial';

/** One rate level as the reports show it: the analysis key, the trial's label and the seed rate. */
export const ReportRateSchema = z.object({
  /** The analysis key: the multiplier of the reference rate as a string ("0.5"). */
  key: z.string(),
  label: z.string(),
  multiplier: z.number(),
  /** Seed sown per unit area in the trial's rate unit (lb/acre or kg/ha); null when the design lacks seed size. */
  seedRate: z.number().nullable(),
});
export type ReportRate = z.infer<typeof ReportRateSchema>;

export const ReportUnitsSchema = z.object({
  /** bu/acre for imperial trials, t/ha for metric ones (kg/ha in metric reports published before). */
  yield: z.string(),
  /** lb/acre or kg/ha. */
  seed: z.string(),
  /** Currency per area for returns ("$/acre"). */
  money: z.string(),
  /** The trial's unit system; absent in reports published before it was added (read the yield unit). */
  system: UnitSystemSchema.optional(),
  /** The crop's bushel weight in lb, to show a grain price per tonne; absent in older reports. */
  bushelPounds: z.number().nullable().optional(),
});
export type ReportUnits = z.infer<typeof ReportUnitsSchema>;

export const SiteHeaderSchema = z.object({
  id: z.uuid(),
  trialId: z.uuid(),
  trialName: z.string(),
  question: z.string(),
  fieldName: z.string(),
  growerName: z.string().nullable(),
  crop: z.string().nullable(),
  cropName: z.string().nullable(),
  season: z.string().nullable(),
  soil: z.string(),
  previousCrop: z.string(),
  fertility: z.string(),
  notes: z.string(),
  dates: z.object({
    sowing: z.string().nullable(),
    emergence: z.string().nullable(),
    heading: z.string().nullable(),
    harvest: z.string().nullable(),
  }),
  design: z.object({
    rates: z.array(ReportRateSchema),
    blocks: z.number(),
    reference: z.string(),
  }),
  completeness: z.object({
    strips: z.number(),
    withYield: z.number(),
    missing: z.number(),
    percent: z.number(),
  }),
  units: ReportUnitsSchema,
  dataVersion: z.number(),
});
export type SiteHeader = z.infer<typeof SiteHeaderSchema>;

/** Mean yield components and economics of one rate at one site. */
export const ComponentRowSchema = z.object({
  rate: z.string(),
  label: z.string(),
  strips: z.number(),
  seedRate: z.number().nullable(),
  plantsPerSquareFoot: z.number().nullable(),
  establishmentPercent: z.number().nullable(),
  tillersPerPlant: z.number().nullable(),
  headsPerSquareFoot: z.number().nullable(),
  headsPerPlant: z.number().nullable(),
  yield: z.number().nullable(),
  /** Grain out per unit of seed in (lb per lb). */
  seedReturn: z.number().nullable(),
  /** Grain value minus seed cost per acre. */
  returnOverSeedCost: z.number().nullable(),
});
export type ComponentRow = z.infer<typeof ComponentRowSchema>;

export const PricesSchema = z.object({
  seedPricePerLb: z.number().nullable(),
  grainPricePerBu: z.number().nullable(),
});
export type ReportPrices = z.infer<typeof PricesSchema>;

export const SiteComponentsSchema = z.object({
  byRate: z.array(ComponentRowSchema),
  prices: PricesSchema,
});
export type SiteComponents = z.infer<typeof SiteComponentsSchema>;

export const ReportStripSchema = z.object({
  id: z.uuid(),
  block: z.number(),
  position: z.number(),
  /** Plot number, unique within the site: block × 100 + position. */
  plotNumber: z.number(),
  rate: z.string(),
  label: z.string(),
  yield: z.number().nullable(),
  plantsPerSquareFoot: z.number().nullable(),
  tillersPerPlant: z.number().nullable(),
  headsPerSquareFoot: z.number().nullable(),
  notes: z.string(),
});
export type ReportStrip = z.infer<typeof ReportStripSchema>;

export const ReportPhotoSchema = z.object({
  id: z.uuid(),
  caption: z.string(),
  stripId: z.uuid().nullable(),
  url: z.string(),
});
export type ReportPhoto = z.infer<typeof ReportPhotoSchema>;

export const PublishedInfoSchema = z.object({
  snapshotId: z.uuid(),
  publishedAt: z.string(),
  publishedBy: z.string().nullable(),
  dataVersion: z.string(),
});
export type PublishedInfo = z.infer<typeof PublishedInfoSchema>;

export type SiteAnalysisResult = SiteAnalysis & { site: string };

export const SiteReportSchema = z.object({
  site: SiteHeaderSchema,
  /** One element of the analysis tool's "sites"; null when the data cannot be analysed yet. */
  analysis: z.custom<SiteAnalysisResult>().nullable(),
  analysisError: z.string().nullable(),
  components: SiteComponentsSchema,
  strips: z.array(ReportStripSchema),
  findings: z.array(z.string()),
  /** F, df, p, LSD, Tukey, Dunnett p and the outlier test: the details below the findings. */
  forStatistician: z.array(z.string()).optional(),
  photos: z.array(ReportPhotoSchema),
  published: PublishedInfoSchema.nullable(),
  dataChangedSincePublished: z.boolean(),
  /** True when this body is the frozen published snapshot rather than live data. */
  fromSnapshot: z.boolean(),
  /** True when the caller coordinates the network (may publish, unpublish and export). */
  canPublish: z.boolean(),
});
export type SiteReport = z.infer<typeof SiteReportSchema>;

/** Filters and prices a reader may change on the pooled report (query string). */
export const PooledQuerySchema = z.object({
  crop: z.string().trim().max(60).optional(),
  season: z.string().trim().max(20).optional(),
  soil: z.string().trim().max(120).optional(),
  previousCrop: z.string().trim().max(120).optional(),
  /** "published" leaves out sites whose own report is not published. */
  sites: z.enum(['all', 'published']).optional(),
  seedPrice: z.coerce.number().min(0, 'At least 0').max(1000, 'At most 1,000').optional(),
  grainPrice: z.coerce.number().positive('Must be above 0').max(10000, 'At most 10,000').optional(),
});
export type PooledQuery = z.infer<typeof PooledQuerySchema>;

export const PooledSiteSchema = z.object({
  id: z.uuid(),
  fieldName: z.string(),
  soil: z.string(),
  previousCrop: z.string(),
  published: z.boolean(),
  /** Strips with yield ÷ strips in the design. */
  stripsWithYield: z.number(),
  strips: z.number(),
});
export type PooledSite = z.infer<typeof PooledSiteSchema>;

export const EconomicsRowSchema = z.object({
  rate: z.string(),
  label: z.string(),
  seedRate: z.number().nullable(),
  seedCost: z.number().nullable(),
  meanYield: z.number(),
  grainValue: z.number().nullable(),
  returnOverSeedCost: z.number().nullable(),
  /** Return over seed cost minus the reference rate's; null without prices. */
  versusReference: z.number().nullable(),
});
export type EconomicsRow = z.infer<typeof EconomicsRowSchema>;

export const PooledReportSchema = z.object({
  trial: z.object({
    id: z.uuid(),
    name: z.string(),
    question: z.string(),
    crop: z.string().nullable(),
    cropName: z.string().nullable(),
    season: z.string().nullable(),
    rates: z.array(ReportRateSchema),
    reference: z.string(),
    units: ReportUnitsSchema,
  }),
  /** The analysis tool's "pooled"; null when fewer than two sites can be analysed. */
  analysis: z.custom<PooledAnalysis>().nullable(),
  analysisError: z.string().nullable(),
  siteDifferences: z.array(
    z.object({
      site: z.string(),
      siteId: z.uuid(),
      rate: z.string(),
      diff: z.number(),
      se: z.number(),
      ciLow: z.number(),
      ciHigh: z.number(),
      p: z.number(),
      lsd: z.number(),
    }),
  ),
  /** Site × rate means (one point per site and rate) for the response curve. */
  siteMeans: z.array(
    z.object({
      site: z.string(),
      rate: z.string(),
      seedRate: z.number().nullable(),
      mean: z.number(),
    }),
  ),
  sitesIncluded: z.array(PooledSiteSchema),
  sitesExcluded: z.array(z.object({ site: PooledSiteSchema, reason: z.string() })),
  economics: z.array(EconomicsRowSchema),
  prices: PricesSchema,
  filters: PooledQuerySchema,
  /** Filter choices present in the trial. */
  filterOptions: z.object({ soil: z.array(z.string()), previousCrop: z.array(z.string()) }),
  findings: z.array(z.string()),
  /** F, df, variance components, Bartlett, R²: the details below the plain-word findings. */
  forStatistician: z.array(z.string()).optional(),
  published: PublishedInfoSchema.nullable(),
  dataChangedSincePublished: z.boolean(),
  fromSnapshot: z.boolean(),
  canPublish: z.boolean(),
  publicLinkToken: z.string().nullable(),
});
export type PooledReport = z.infer<typeof PooledReportSchema>;

export const PublicLinkInputSchema = z.object({ enabled: z.boolean() });
export type PublicLinkInput = z.infer<typeof PublicLinkInputSchema>;

export const PublicLinkSchema = z.object({ token: z.string().nullable() });
export type PublicLink = z.infer<typeof PublicLinkSchema>;
