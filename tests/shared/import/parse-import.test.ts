import { describe, expect, it } from 'vitest';
import { buildImportTemplate } from '../../../shared/import/build-template';
import { csvDelimiter, parseImportCsv } from '../../../shared/import/parse-import';
import { EMPTY_OBSERVATION } from '../../../shared/schemas/observation';

const strips = [
  { block: 1, position: 1, label: 'half', rate: 0.5 },
  { block: 1, position: 2, label: 'full', rate: 1 },
  { block: 2, position: 1, label: 'full', rate: 1 },
  { block: 2, position: 2, label: 'half', rate: 0.5 },
];
const context = { unitSystem: 'metric' as const, fieldName: 'Creek field', strips };

describe('parseImportCsv', () => {
  it('reads a semicolon file with decimal commas, as a spreadsheet set to a decimal comma saves it', () => {
    expect(csvDelimiter('site;plot;moisture_pct\r\n')).toBe(';');
    const parsed = parseImportCsv(
      'site;plot;moisture_pct;grain_weight_kg\r\nCreek field;201;13,5;2,75\r\n',
      context,
    );
    expect(parsed.errors).toEqual([]);
    expect(parsed.rows).toEqual([
      { row: 2, block: 2, position: 1, patch: { moisturePct: 13.5, grainWeight: 2.75 } },
    ]);
  });

  it('reads back its own template with values unchanged', () => {
    const values = { ...EMPTY_OBSERVATION, standCounts: [12, 14], moisturePct: 12.5 };
    const csv = buildImportTemplate({
      ...context,
      strips: strips.map((s) => ({ ...s, values })),
    });
    const parsed = parseImportCsv(csv, context);
    expect(parsed.errors).toEqual([]);
    expect(parsed.rows[3]).toMatchObject({
      block: 2,
      position: 2,
      patch: { standCounts: [12, 14], moisturePct: 12.5 },
    });
  });
});
