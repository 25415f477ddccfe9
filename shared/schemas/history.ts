// A site's history in plain words: who did what, when.
import { z } from 'zod';

export const HistoryEntrySchema = z.object({
  id: z.uuid(),
  /** ISO time; the page shows it in the reader's own time zone. */
  at: z.string(),
  who: z.string(),
  /** "Ina Bell changed the threshed grain weight of plot 203 from 4.1 to 4.2 lb". */
  sentence: z.string(),
});
export type HistoryEntry = z.infer<typeof HistoryEntrySchema>;
