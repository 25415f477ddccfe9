// CSV import contract: the answer to POST /api/sites/:siteId/import.
import { z } from 'zod';

/** Largest CSV accepted, in bytes. */
export const IMPORT_MAX_BYTES = 5 * 1024 * 1024;

export const ImportRowErrorSchema = z.object({
  /** Spreadsheet row number: the header is row 1, the first strip row 2. */
  row: z.number().int(),
  column: z.string(),
  message: z.string(),
});
export type ImportRowError = z.infer<typeof ImportRowErrorSchema>;

export const ImportResultSchema = z.object({
  rows: z.number().int(),
  changedStrips: z.number().int(),
  unchangedStrips: z.number().int(),
  dataVersion: z.number().int(),
});
export type ImportResult = z.infer<typeof ImportResultSchema>;
