// Reads a site's strip CSV into per-strip partial updates, or row-and-column errors. Runs in the
// browser for the preview and on the server for the real import, so both report the same.
import Papa from 'papaparse';
import { ObservationValuesSchema } from '../schemas/observation';
import type { ImportRowError } from '../schemas/import';
import type { StripValuesPatch } from '../schemas/strip';
import type { UnitSystem } from '../schemas/trial';
import { parseDecimal } from '../units/parse-decimal';
import { plotNumber } from '../units/plot-number';
import { otherSystemHeader, templateHeaders, valueColumns, type ValueColumn } from './columns';

export interface ImportStripRef {
  block: number;
  position: number;
  label: string;
  rate: number;
}

export interface ImportContext {
  unitSystem: UnitSystem;
  fieldName: string;
  strips: readonly ImportStripRef[];
}

export interface ParsedImportRow {
  /** Spreadsheet row number (header = 1). */
  row: number;
  block: number;
  position: number;
  patch: StripValuesPatch;
}

export interface ParsedImport {
  headers: string[];
  rows: ParsedImportRow[];
  errors: ImportRowError[];
}

/** Spreadsheets run cells starting with these as formulas; the template prefixes them with '. */
const FORMULA_START = /^'[=+\-@\t\r]/;

/** Undoes the template's formula guard: `'=x` was written for a stored `=x`. */
export function unguardCell(cell: string): string {
  return FORMULA_START.test(cell) ? cell.slice(1) : cell;
}

function readCell(raw: string, column: ValueColumn): { value: unknown } | { error: string } {
  const text = column.kind === 'text' ? raw : raw.trim();
  if (column.kind === 'text') return { value: text };
  if (column.kind === 'date') return { value: text };
  const read = parseDecimal(text);
  if (!read.ok) return { error: `${read.message} ("${text.slice(0, 40)}")` };
  return { value: read.value };
}

/**
 * The cell separator: a spreadsheet set to a decimal comma saves CSV with semicolons. Template
 * headers never contain a comma or a semicolon, so the header line tells which one the file uses.
 */
export function csvDelimiter(text: string): ',' | ';' | '\t' {
  const header = text.split(/\r?\n/, 1)[0] ?? '';
  const count = (ch: string) => header.split(ch).length - 1;
  const counts = { ',': count(','), ';': count(';'), '\t': count('\t') } as const;
  if (counts[';'] > counts[','] && counts[';'] >= counts['\t']) return ';';
  if (counts['\t'] > counts[',']) return '\t';
  return ',';
}

/** A whole number from an identity cell (block, position, plot), or null. */
function wholeNumber(text: string): number | null {
  const read = parseDecimal(text);
  return read.ok && read.value !== null && Number.isInteger(read.value) ? read.value : null;
}

function checkField(
  field: keyof typeof ObservationValuesSchema.shape,
  value: unknown,
): { path: PropertyKey[]; message: string }[] {
  const result = ObservationValuesSchema.shape[field].safeParse(value);
  return result.success
    ? []
    : result.error.issues.map((issue) => ({ path: issue.path, message: issue.message }));
}

/**
 * Parses CSV text against a site. An empty cell leaves the stored value as it is; a row with
 * subsample cells replaces that list with the filled cells in order.
 */
export function parseImportCsv(text: string, context: ImportContext): ParsedImport {
  const errors: ImportRowError[] = [];
  const clean = text.replace(/^\uFEFF/, '');
  const parsed = Papa.parse<string[]>(clean, {
    skipEmptyLines: 'greedy',
    delimiter: csvDelimiter(clean),
  });
  const table = parsed.data;
  const headerRow = (table[0] ?? []).map((h) => h.trim().toLowerCase());
  if (headerRow.length === 0) {
    return {
      headers: [],
      rows: [],
      errors: [{ row: 1, column: '', message: 'The file is empty: start from the template' }],
    };
  }
  const columns = valueColumns(context.unitSystem);
  const byHeader = new Map(columns.map((c) => [c.header, c]));
  const known = new Set(templateHeaders(context.unitSystem));
  const seen = new Set<string>();
  headerRow.forEach((header) => {
    if (header === '') {
      errors.push({ row: 1, column: '', message: 'A column has no header name' });
    } else if (seen.has(header)) {
      errors.push({ row: 1, column: header, message: 'This column appears twice' });
    } else if (!known.has(header)) {
      const instead = otherSystemHeader(header, context.unitSystem);
      errors.push({
        row: 1,
        column: header,
        message: instead
          ? `This trial records in ${context.unitSystem} units: convert the values and name the column ${instead}`
          : 'Unknown column: use the header names of the template',
      });
    }
    seen.add(header);
  });
  if (!seen.has('plot')) {
    for (const required of ['block', 'position'] as const) {
      if (!seen.has(required))
        errors.push({
          row: 1,
          column: required,
          message: `The ${required} column is missing (or give a plot column)`,
        });
    }
  }
  if (errors.length > 0) return { headers: headerRow, rows: [], errors };

  const stripByKey = new Map(context.strips.map((s) => [`${s.block}:${s.position}`, s]));
  const stripByPlot = new Map(context.strips.map((s) => [plotNumber(s.block, s.position), s]));
  const rowsSeen = new Map<string, number>();
  const rows: ParsedImportRow[] = [];
  table.slice(1).forEach((cells, offset) => {
    const rowNumber = offset + 2;
    const cell = (header: string) => {
      const index = headerRow.indexOf(header);
      return index < 0 ? '' : unguardCell(cells[index] ?? '');
    };
    if (
      cells.length > headerRow.length &&
      cells.slice(headerRow.length).some((c) => c.trim() !== '')
    ) {
      errors.push({
        row: rowNumber,
        column: '',
        message: 'This row has more cells than the header has columns',
      });
    }
    const plotText = cell('plot').trim();
    const plot = wholeNumber(plotText);
    if (plotText !== '' && (plot === null || !stripByPlot.has(plot))) {
      errors.push({
        row: rowNumber,
        column: 'plot',
        message: `This site has no plot "${plotText.slice(0, 20)}"`,
      });
      return;
    }
    const fromPlot = plot === null ? undefined : stripByPlot.get(plot);
    const blockText = cell('block').trim();
    const positionText = cell('position').trim();
    const block = blockText === '' && fromPlot ? fromPlot.block : wholeNumber(blockText);
    const position =
      positionText === '' && fromPlot ? fromPlot.position : wholeNumber(positionText);
    if (block === null) {
      errors.push({ row: rowNumber, column: 'block', message: 'Give the block number' });
      return;
    }
    if (position === null) {
      errors.push({
        row: rowNumber,
        column: 'position',
        message: 'Give the position in the block',
      });
      return;
    }
    const key = `${block}:${position}`;
    const strip = stripByKey.get(key);
    if (!strip) {
      errors.push({
        row: rowNumber,
        column: 'position',
        message: `This site has no strip at block ${block}, position ${position}`,
      });
      return;
    }
    if (fromPlot && fromPlot !== strip) {
      errors.push({
        row: rowNumber,
        column: 'plot',
        message: `Plot ${plot} is block ${fromPlot.block}, position ${fromPlot.position}, not block ${block}, position ${position}`,
      });
      return;
    }
    if (rowsSeen.has(key)) {
      errors.push({
        row: rowNumber,
        column: 'position',
        message: `Block ${block}, position ${position} is already on row ${rowsSeen.get(key)}`,
      });
      return;
    }
    rowsSeen.set(key, rowNumber);
    const site = cell('site').trim();
    if (site !== '' && site.toLowerCase() !== context.fieldName.trim().toLowerCase()) {
      errors.push({
        row: rowNumber,
        column: 'site',
        message: `This file is for "${site.slice(0, 60)}", not ${context.fieldName}`,
      });
    }
    const rate = cell('rate').trim();
    const rateRead = parseDecimal(rate.replace(/\s*[x×]$/i, ''));
    if (
      rate !== '' &&
      rate.toLowerCase() !== strip.label.toLowerCase() &&
      !(rateRead.ok && rateRead.value === strip.rate)
    ) {
      errors.push({
        row: rowNumber,
        column: 'rate',
        message: `The map has the ${strip.label} rate at block ${block}, position ${position}, not "${rate.slice(0, 40)}"`,
      });
    }

    const patch: Record<string, unknown> = {};
    const lists: Record<string, { values: number[]; headers: string[] }> = {};
    for (const header of headerRow) {
      const column = byHeader.get(header);
      if (!column) continue;
      const raw = cell(header);
      if ((column.kind === 'text' ? raw : raw.trim()) === '') continue;
      const read = readCell(raw, column);
      if ('error' in read) {
        errors.push({ row: rowNumber, column: header, message: read.error });
        continue;
      }
      if (column.index !== undefined) {
        const list = (lists[column.field] ??= { values: [], headers: [] });
        list.values.push(read.value as number);
        list.headers.push(header);
        continue;
      }
      const problems = checkField(column.field, read.value);
      if (problems.length > 0) {
        errors.push({ row: rowNumber, column: header, message: problems[0]!.message });
        continue;
      }
      patch[column.field] = read.value;
    }
    for (const [field, list] of Object.entries(lists)) {
      const problems = checkField(field as keyof typeof ObservationValuesSchema.shape, list.values);
      if (problems.length > 0) {
        for (const problem of problems) {
          const index = typeof problem.path[0] === 'number' ? problem.path[0] : 0;
          errors.push({
            row: rowNumber,
            column: list.headers[index] ?? list.headers[0]!,
            message: problem.message,
          });
        }
        continue;
      }
      patch[field] = list.values;
    }
    rows.push({ row: rowNumber, block, position, patch: patch as StripValuesPatch });
  });
  if (rows.length === 0 && errors.length === 0) {
    errors.push({ row: 2, column: '', message: 'The file has a header but no strip rows' });
  }
  return { headers: headerRow, rows, errors };
}
