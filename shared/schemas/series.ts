// Series contract: trials of one crop linked across seasons, and the series report that pools them.
import { z } from 'zod';
import { CropKeySchema, TrialStatusSchema } from './trial';

export const SeriesNameSchema = z
  .string()
  .trim()
  .min(3, 'Name the series (at least 3 characters)')
  .max(120, 'At most 120 characters');

export const CreateSeriesInputSchema = z.object({
  name: SeriesNameSchema,
  crop: CropKeySchema,
  /** Needed only when the caller coordinates more than one network. */
  networkId: z.uuid().optional(),
});
export type CreateSeriesInput = z.infer<typeof CreateSeriesInputSchema>;

/** PUT /api/trials/:trialId/series: link a trial to a series, or unlink it with null. */
export const LinkTrialSeriesInputSchema = z.object({
  seriesId: z.uuid('Choose a series').nullable(),
});
export type LinkTrialSeriesInput = z.infer<typeof LinkTrialSeriesInputSchema>;

export const SeriesTrialSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  season: z.string().nullable(),
  status: TrialStatusSchema,
});
export type SeriesTrial = z.infer<typeof SeriesTrialSchema>;

export const SeriesSummarySchema = z.object({
  id: z.uuid(),
  networkId: z.uuid(),
  networkName: z.string(),
  name: z.string(),
  crop: CropKeySchema,
  createdAt: z.string(),
  trials: z.array(SeriesTrialSchema),
});
export type SeriesSummary = z.infer<typeof SeriesSummarySchema>;

/** GET /api/series/:seriesId: the series, and for coordinators the trials they could link. */
export const SeriesDetailSchema = SeriesSummarySchema.extend({
  canEdit: z.boolean(),
  /** Trials of the same crop in the network, not in this series (coordinators only). */
  candidates: z.array(SeriesTrialSchema),
});
export type SeriesDetail = z.infer<typeof SeriesDetailSchema>;

const IntervalSchema = z.object({ mean: z.number(), ciLow: z.number(), ciHigh: z.number() });

/** GET /api/series/:seriesId/report: the pool of every site-season beside each season. */
export const SeriesReportSchema = z.object({
  series: z.object({ id: z.uuid(), name: z.string(), crop: CropKeySchema, cropName: z.string() }),
  /** Yield unit of the whole report (the most recent trial's). */
  unit: z.string(),
  reference: z.string(),
  /** Plain-words findings, in reading order. */
  findings: z.array(z.string()),
  seasons: z.array(
    z.object({
      season: z.string(),
      trialId: z.uuid(),
      trialName: z.string(),
      sites: z.number(),
      leftOut: z.array(z.object({ name: z.string(), reason: z.string() })),
      note: z.string().nullable(),
    }),
  ),
  means: z.object({
    caption: z.string(),
    seasonCaption: z.string(),
    rows: z.array(
      z.object({
        rate: z.string(),
        label: z.string(),
        pooled: IntervalSchema.nullable(),
        seasons: z.array(z.number().nullable()),
      }),
    ),
  }),
  differences: z.object({
    caption: z.string(),
    rows: z.array(
      z.object({
        rate: z.string(),
        label: z.string(),
        estimate: z.number(),
        ciLow: z.number(),
        ciHigh: z.number(),
        p: z.number(),
        ciLowAdjusted: z.number(),
        ciHighAdjusted: z.number(),
        pAdjusted: z.number(),
        /** Each season's own difference from the reference (null when it could not be fitted). */
        seasons: z.array(z.number().nullable()),
        /** Seasons where this rate did as well as the reference, of the seasons compared. */
        asWell: z.number(),
        compared: z.number(),
      }),
    ),
  }),
  statistician: z.object({
    varianceComponents: z.array(
      z.object({ name: z.string(), label: z.string(), value: z.number() }),
    ),
    rateTest: z
      .object({ f: z.number(), df1: z.number(), df2: z.number(), p: z.number() })
      .nullable(),
    seasonTests: z.array(
      z.object({
        season: z.string(),
        f: z.number(),
        df1: z.number(),
        df2: z.number(),
        p: z.number(),
      }),
    ),
    notes: z.array(z.string()),
  }),
  /** Trials a non-coordinator cannot see pooled yet (their pooled report is not published). */
  unpublishedTrials: z.number(),
  canLink: z.boolean(),
});
export type SeriesReport = z.infer<typeof SeriesReportSchema>;
