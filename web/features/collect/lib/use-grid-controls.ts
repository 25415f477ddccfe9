// The grid's keyboard and clipboard: arrow keys move between cells (one Tab stop for the whole
// grid), and a block pasted from a spreadsheet fills strips and columns from the focused cell.
import { useRef, useState, type ClipboardEvent, type FocusEvent, type KeyboardEvent } from 'react';
import type { ValueColumn } from '../../../../shared/import/columns';
import { cellName, gridMove, parseCellName, type GridPosition } from './grid-navigation';
import { pastedBlock, pastePatches, type PasteRow } from './grid-paste';
import { queueEdit } from './outbox';

/** Moves focus to a cell, selecting its text; nothing happens outside the grid. */
export function focusCell(at: GridPosition) {
  const input = document.querySelector<HTMLInputElement>(`[data-cell="${cellName(at)}"]`);
  if (input) {
    input.focus();
    input.select();
  }
}

export type PasteHandler = (event: ClipboardEvent<HTMLInputElement>, at: GridPosition) => void;

/**
 * A paste handler that stays the same function between renders (react-table's cell renderers
 * are component types: a new function would remount the inputs and lose focus), reading the
 * latest rows and columns from refs; and the errors of the last paste.
 */
export function useGridPaste(rows: readonly PasteRow[], columns: readonly ValueColumn[]) {
  const [pasteErrors, setPasteErrors] = useState<string[]>([]);
  const latest = useRef({ rows, columns });
  latest.current = { rows, columns };
  const handler = useRef<PasteHandler>((event, at) => {
    const block = pastedBlock(event.clipboardData.getData('text/plain'));
    if (!block) return;
    event.preventDefault();
    const { edits, errors } = pastePatches(block, at, latest.current.rows, latest.current.columns);
    for (const { strip, patch } of edits) queueEdit(strip, patch);
    setPasteErrors(errors);
  });
  return { paste: handler.current, pasteErrors };
}

/** The grid's key handler (on its container) and the cell that holds the one Tab stop. */
export function useGridKeys(size: { rows: number; cols: number }) {
  const [activeCell, setActiveCell] = useState('0:0');
  const onKeyDown = (event: KeyboardEvent<HTMLElement>) => {
    const target = event.target as HTMLInputElement;
    const cell = target.dataset?.cell;
    if (!cell) return;
    const to = gridMove(
      event,
      parseCellName(cell),
      { start: target.selectionStart, end: target.selectionEnd, length: target.value.length },
      size,
    );
    if (!to) return;
    event.preventDefault();
    focusCell(to);
  };
  const onFocus = (event: FocusEvent<HTMLElement>) => {
    const cell = event.target.dataset?.cell;
    if (cell && cell !== activeCell) setActiveCell(cell);
  };
  return { activeCell, onKeyDown, onFocus };
}
