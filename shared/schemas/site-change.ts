// PATCH /api/sites/:siteId: hand a site to another grower, mark it lost, or (its grower) choose
// whether network reports name the farm.
import { z } from 'zod';

export const SiteChangeInputSchema = z
  .object({
    /** The grower who takes the site over; null leaves it without a grower. */
    growerUserId: z.uuid('Choose a person of this network').nullable().optional(),
    /** Why the site gave no harvest (hail, flood, grazed…); null takes the mark away. */
    lostReason: z
      .string()
      .trim()
      .min(3, 'Say in a few words what happened')
      .max(300, 'At most 300 characters')
      .nullable()
      .optional(),
    namedInReports: z.boolean().optional(),
  })
  .strict();
export const SITE_CHANGE_KEYS: readonly string[] = Object.keys(SiteChangeInputSchema.shape);
export type SiteChangeInput = z.infer<typeof SiteChangeInputSchema>;

export const SiteChangeResultSchema = z.object({
  id: z.uuid(),
  growerUserId: z.uuid().nullable(),
  growerName: z.string().nullable(),
  lostReason: z.string().nullable(),
  namedInReports: z.boolean(),
});
export type SiteChangeResult = z.infer<typeof SiteChangeResultSchema>;
