// A block of cells pasted from a spreadsheet: split into rows and cells, then turned into one
// patch per strip from the focused cell rightwards and downwards; cells that cannot be saved are
// listed with their plot and column.
import type { ObservationValues } from '../../../../shared/schemas/observation';
import type { StripDto, StripValuesPatch } from '../../../../shared/schemas/strip';
import type { ValueColumn } from '../../../../shared/import/columns';
import type { GridPosition } from './grid-navigation';
import { patchForCell } from './strip-values';

export interface PasteRow {
  strip: StripDto;
  values: ObservationValues;
}

/**
 * The cells of pasted text, or null when it is a single value (typed normally by the input).
 * Spreadsheets separate cells with tabs and rows with newlines, and end with one newline.
 */
export function pastedBlock(text: string): string[][] | null {
  const trimmed = text.replace(/\r/g, '').replace(/\n$/, '');
  if (!/[\t\n]/.test(trimmed)) return null;
  return trimmed.split('\n').map((line) => line.split('\t'));
}

/** One patch per strip the block reaches, and a message for each cell not taken. */
export function pastePatches(
  block: readonly (readonly string[])[],
  from: GridPosition,
  rows: readonly PasteRow[],
  columns: readonly ValueColumn[],
): { edits: { strip: StripDto; patch: StripValuesPatch }[]; errors: string[] } {
  const errors: string[] = [];
  const edits: { strip: StripDto; patch: StripValuesPatch }[] = [];
  block.forEach((cells, i) => {
    const target = rows[from.row + i];
    if (!target) return;
    let values = target.values;
    let patch: StripValuesPatch = {};
    cells.forEach((cell, j) => {
      const column = columns[from.col + j];
      if (!column) return;
      const result = patchForCell(values, column, cell);
      if ('error' in result) {
        errors.push(
          `Plot ${target.strip.plotNumber}, ${column.header}: ${result.error} ("${cell.slice(0, 20)}")`,
        );
        return;
      }
      values = { ...values, ...result.patch };
      patch = { ...patch, ...result.patch };
    });
    if (Object.keys(patch).length > 0) edits.push({ strip: target.strip, patch });
  });
  return { edits, errors };
}
