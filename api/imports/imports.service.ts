// CSV import of a site's strip values: all rows checked first, then written in one transaction;
// a file whose values are already stored changes nothing.
import iconv from 'iconv-lite';
import { In, type DataSource } from 'typeorm';
import { Strip } from '../../db/entities/strip.entity';
import { buildImportTemplate } from '../../shared/import/build-template';
import type { ImportResult } from '../../shared/schemas/import';
import { ObservationValuesSchema, type ObservationValues } from '../../shared/schemas/observation';
import { recordAuditsInBulk, type AuditInput } from '../audit/audit.service';
import { AppError, InvalidRows } from '../errors';
import {
  bumpDataVersion,
  changedFields,
  loadSite,
  loadSiteStrips,
  lockSiteForChange,
  writeObservationsInBulk,
} from '../lib/strip-data';
import { parseImportInWorker } from './csv-parser';

/** How many problems an answer lists; the message counts the rest. */
export const MAX_LISTED_PROBLEMS = 100;

/** Reads an uploaded file as CSV text, refusing anything that is not text by its content. */
export async function csvText(buffer: Buffer, declaredType: string): Promise<string> {
  const { fileTypeFromBuffer } = await import('file-type');
  const detected = await fileTypeFromBuffer(buffer);
  if (detected) {
    throw new AppError(
      415,
      'unsupported_media_type',
      `This file is ${detected.ext.toUpperCase()} (${detected.mime}), not CSV. In your spreadsheet use "Save as" → CSV.`,
    );
  }
  if (/^(image|video|audio)\//.test(declaredType) || buffer.includes(0)) {
    throw new AppError(
      415,
      'unsupported_media_type',
      'This file is not CSV text. In your spreadsheet use "Save as" → CSV.',
    );
  }
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(buffer);
  } catch {
    // Older spreadsheet programs save CSV in the Windows Western encoding. Not TextDecoder:
    // Node 20's 'windows-1252' decoder reads bytes 0x80–0x9F as control characters (latin1).
    return iconv.decode(buffer, 'win1252');
  }
}

export function createImportsService(deps: { dataSource: DataSource }) {
  const { dataSource } = deps;
  return {
    async template(
      siteId: string,
      kind: 'strips' | 'export' = 'strips',
    ): Promise<{ fileName: string; csv: string }> {
      const site = await loadSite(dataSource.manager, siteId);
      const strips = await loadSiteStrips(dataSource.manager, siteId);
      const slug =
        site.fieldName
          .toLowerCase()
          .replace(/[^a-z0-9]+/g, '-')
          .replace(/^-|-$/g, '') || 'site';
      return {
        fileName: `sheaf-${slug}-${kind}.csv`,
        csv: buildImportTemplate({
          unitSystem: site.unitSystem,
          fieldName: site.fieldName,
          strips,
        }),
      };
    },

    async importCsv(siteId: string, text: string, actorUserId: string): Promise<ImportResult> {
      // Parsed before the transaction, in a worker thread: a large file neither blocks other
      // requests nor holds the site's lock while it is read. The layout of strips (block,
      // position, rate) does not change once a trial is randomized.
      const siteBefore = await loadSite(dataSource.manager, siteId);
      const parsed = await parseImportInWorker(text, {
        unitSystem: siteBefore.unitSystem,
        fieldName: siteBefore.fieldName,
        strips: (await loadSiteStrips(dataSource.manager, siteId)).map((s) => ({
          block: s.block,
          position: s.position,
          label: s.label,
          rate: s.rate,
        })),
      });
      return dataSource.transaction(async (manager) => {
        const site = await lockSiteForChange(manager, siteId);
        const strips = await loadSiteStrips(manager, siteId, { lock: true });
        const byKey = new Map(strips.map((s) => [`${s.block}:${s.position}`, s]));
        const planned = [];
        const errors = [...parsed.errors];
        for (const row of parsed.rows) {
          const strip = byKey.get(`${row.block}:${row.position}`);
          if (!strip) {
            errors.push({
              row: row.row,
              column: 'position',
              message: 'This strip is gone; reload the page',
            });
            continue;
          }
          const merged = ObservationValuesSchema.safeParse({ ...strip.values, ...row.patch });
          if (!merged.success) {
            errors.push({
              row: row.row,
              column: String(merged.error.issues[0]?.path[0] ?? ''),
              message: merged.error.issues[0]?.message ?? 'Invalid value',
            });
            continue;
          }
          planned.push({ strip, values: merged.data });
        }
        if (errors.length > 0) {
          errors.sort((a, b) => a.row - b.row);
          const listed = errors.slice(0, MAX_LISTED_PROBLEMS);
          const more = errors.length - listed.length;
          throw new InvalidRows(
            `${errors.length === 1 ? 'One problem' : `${errors.length.toLocaleString('en-US')} problems`} in the file; nothing was saved. Fix ${errors.length === 1 ? 'it' : 'them'} and upload again.${more > 0 ? ` The first ${listed.length} are listed; ${more.toLocaleString('en-US')} more are not shown.` : ''}`,
            listed,
          );
        }
        const writes: { stripId: string; values: ObservationValues }[] = [];
        const audits: AuditInput[] = [];
        for (const { strip, values } of planned) {
          const diff = changedFields(strip.values, values);
          if (!diff) continue;
          writes.push({ stripId: strip.stripId, values });
          audits.push({
            actorUserId,
            entityType: 'strip',
            entityId: strip.stripId,
            siteId,
            action: 'import',
            before: diff.before,
            after: diff.after,
          });
        }
        await manager
          .getRepository(Strip)
          .update({ id: In(writes.map((w) => w.stripId)) }, { version: () => 'version + 1' });
        await writeObservationsInBulk(manager, writes, actorUserId);
        await recordAuditsInBulk(manager, audits);
        const changed = writes.length;
        const dataVersion = changed > 0 ? await bumpDataVersion(manager, siteId) : site.dataVersion;
        return {
          rows: parsed.rows.length,
          changedStrips: changed,
          unchangedStrips: parsed.rows.length - changed,
          dataVersion,
        };
      });
    },
  };
}
