// Writes a site's strip CSV: identity columns filled in, current values in the value columns,
// and cells a spreadsheet would run as a formula guarded with a leading apostrophe.
import Papa from 'papaparse';
import type { ObservationValues } from '../schemas/observation';
import type { UnitSystem } from '../schemas/trial';
import { plotNumber } from '../units/plot-number';
import { templateHeaders, valueColumns } from './columns';

export interface TemplateStrip {
  block: number;
  position: number;
  label: string;
  values: ObservationValues;
}

/** The CSV text (CRLF line ends, as spreadsheets write) for a site's strips, block by block. */
export function buildImportTemplate(input: {
  unitSystem: UnitSystem;
  fieldName: string;
  strips: readonly TemplateStrip[];
}): string {
  const columns = valueColumns(input.unitSystem);
  const strips = [...input.strips].sort((a, b) => a.block - b.block || a.position - b.position);
  const rows = strips.map((strip) => [
    input.fieldName,
    String(plotNumber(strip.block, strip.position)),
    String(strip.block),
    String(strip.position),
    strip.label,
    ...columns.map((column) => {
      const value = strip.values[column.field];
      const item = Array.isArray(value) ? value[column.index ?? 0] : value;
      return item === null || item === undefined ? '' : String(item);
    }),
  ]);
  return Papa.unparse(
    { fields: templateHeaders(input.unitSystem), data: rows },
    { escapeFormulae: true, newline: '\r\n' },
  );
}
