// Strip-map contract: a site's randomized blocks and strips in field order, with seed weights.
import { z } from 'zod';

export const LayoutStripSchema = z.object({
  stripId: z.uuid(),
  /** Position within the block, 1 = first strip in field order. */
  position: z.number().int().min(1),
  /** Plot number, unique within the site: block × 100 + position (101, 102 … 201 …). */
  plotNumber: z.number().int(),
  rateLevelId: z.uuid(),
  /** Multiplier of the reference rate (0.5 = half). */
  rate: z.number(),
  label: z.string(),
  /** Grams of seed to weigh out for the whole strip (0 when the seed lot is not known). */
  seedGrams: z.number(),
  seedsPerFootOfRow: z.number().nullable(),
});
export type LayoutStrip = z.infer<typeof LayoutStripSchema>;

export const LayoutSchema = z.object({
  siteId: z.uuid(),
  seed: z.string(),
  randomizedAt: z.string().nullable(),
  blocks: z.array(z.object({ block: z.number().int().min(1), strips: z.array(LayoutStripSchema) })),
});
export type Layout = z.infer<typeof LayoutSchema>;
