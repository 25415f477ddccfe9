// Where a key press moves the grid's focus: arrows, Enter and Shift+Enter, and Ctrl+Home/End.
// Left and right leave a cell only when the caret is at its edge, so typing can still move
// inside a value.

export interface GridPosition {
  row: number;
  col: number;
}

export interface GridKey {
  key: string;
  shiftKey: boolean;
  ctrlKey: boolean;
}

/** Where the caret sits in the cell; null offsets mean the input reports none (e.g. a number box). */
export interface Caret {
  start: number | null;
  end: number | null;
  length: number;
}

/**
 * The cell a key moves to from `at`, or null when the key is not the grid's. The result may lie
 * outside the grid (row −1); the caller's focus finds no cell there and stays put.
 */
export function gridMove(
  press: GridKey,
  at: GridPosition,
  caret: Caret,
  size: { rows: number; cols: number },
): GridPosition | null {
  const { row, col } = at;
  const noCaret = caret.start === null;
  const atStart = caret.start === 0 && caret.end === 0;
  const atEnd = caret.start === caret.length;
  switch (press.key) {
    case 'ArrowDown':
      return { row: row + 1, col };
    case 'ArrowUp':
      return { row: row - 1, col };
    case 'Enter':
      return { row: press.shiftKey ? row - 1 : row + 1, col };
    case 'ArrowLeft':
      return atStart || noCaret ? { row, col: col - 1 } : null;
    case 'ArrowRight':
      return atEnd || noCaret ? { row, col: col + 1 } : null;
    case 'Home':
      return press.ctrlKey ? { row: 0, col: 0 } : null;
    case 'End':
      return press.ctrlKey ? { row: size.rows - 1, col: size.cols - 1 } : null;
    default:
      return null;
  }
}

/** The "row:col" name a cell carries in its data-cell attribute. */
export function cellName(at: GridPosition): string {
  return `${at.row}:${at.col}`;
}

/** Reads a data-cell attribute back into a position. */
export function parseCellName(name: string): GridPosition {
  const [row, col] = name.split(':').map(Number) as [number, number];
  return { row, col };
}
