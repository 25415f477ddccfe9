// The pure parts of the strip grid: where a key moves focus, how a pasted block becomes one
// patch per strip, and the field order of strips.
import { describe, expect, it } from 'vitest';
import { valueColumns } from '../../shared/import/columns';
import { gridMove } from '../../web/features/collect/lib/grid-navigation';
import { pastedBlock, pastePatches } from '../../web/features/collect/lib/grid-paste';
import { fieldOrder, neighbours } from '../../web/features/collect/lib/strip-order';
import { buildSiteStrips } from './collect-builders';

const size = { rows: 4, cols: 10 };
const press = (key: string, mods: { shiftKey?: boolean; ctrlKey?: boolean } = {}) => ({
  key,
  shiftKey: mods.shiftKey ?? false,
  ctrlKey: mods.ctrlKey ?? false,
});
const caret = (start: number | null, end: number | null, length: number) => ({
  start,
  end,
  length,
});

describe('gridMove', () => {
  it('moves down with ArrowDown and Enter, up with ArrowUp and Shift+Enter', () => {
    const at = { row: 1, col: 2 };
    expect(gridMove(press('ArrowDown'), at, caret(0, 0, 0), size)).toEqual({ row: 2, col: 2 });
    expect(gridMove(press('Enter'), at, caret(0, 0, 0), size)).toEqual({ row: 2, col: 2 });
    expect(gridMove(press('ArrowUp'), at, caret(0, 0, 0), size)).toEqual({ row: 0, col: 2 });
    expect(gridMove(press('Enter', { shiftKey: true }), at, caret(0, 0, 0), size)).toEqual({
      row: 0,
      col: 2,
    });
  });

  it('leaves a cell sideways only from the edge of its text', () => {
    const at = { row: 0, col: 3 };
    expect(gridMove(press('ArrowLeft'), at, caret(1, 1, 2), size)).toBeNull();
    expect(gridMove(press('ArrowLeft'), at, caret(0, 0, 2), size)).toEqual({ row: 0, col: 2 });
    expect(gridMove(press('ArrowRight'), at, caret(1, 1, 2), size)).toBeNull();
    expect(gridMove(press('ArrowRight'), at, caret(2, 2, 2), size)).toEqual({ row: 0, col: 4 });
    expect(gridMove(press('ArrowRight'), at, caret(null, null, 2), size)).toEqual({
      row: 0,
      col: 4,
    });
  });

  it('jumps to the first and last cell with Ctrl+Home and Ctrl+End, and ignores other keys', () => {
    const at = { row: 2, col: 2 };
    expect(gridMove(press('Home', { ctrlKey: true }), at, caret(0, 0, 0), size)).toEqual({
      row: 0,
      col: 0,
    });
    expect(gridMove(press('End', { ctrlKey: true }), at, caret(0, 0, 0), size)).toEqual({
      row: 3,
      col: 9,
    });
    expect(gridMove(press('Home'), at, caret(0, 0, 0), size)).toBeNull();
    expect(gridMove(press('a'), at, caret(0, 0, 0), size)).toBeNull();
  });
});

describe('pastedBlock and pastePatches', () => {
  const data = buildSiteStrips('metric');
  const rows = fieldOrder(data.strips).map((strip) => ({ strip, values: strip.values }));
  const columns = valueColumns('metric').filter((c) => c.kind !== 'date');

  it('leaves a single value to the input, and splits a spreadsheet block', () => {
    expect(pastedBlock('12')).toBeNull();
    expect(pastedBlock('12\n')).toBeNull();
    expect(pastedBlock('1\t2\r\n3\t4\r\n')).toEqual([
      ['1', '2'],
      ['3', '4'],
    ]);
  });

  it('makes one patch per strip, reads decimal commas, and names the cells refused', () => {
    const standRow = columns.findIndex((c) => c.field === 'standRowLength');
    const block = [
      ['1', '0,5'],
      ['x', '1'],
      ['2', '1'],
    ];
    // From the last stand count: count 6 and the row length, for plots 101, 102 and 201.
    const { edits, errors } = pastePatches(block, { row: 0, col: standRow - 1 }, rows, columns);
    expect(edits.map((e) => [e.strip.plotNumber, e.patch])).toEqual([
      [101, { standCounts: [1], standRowLength: 0.5 }],
      [102, { standRowLength: 1 }],
      [201, { standCounts: [2], standRowLength: 1 }],
    ]);
    expect(errors).toEqual([`Plot 102, ${columns[standRow - 1]!.header}: Enter a number ("x")`]);
  });

  it('drops what falls outside the grid', () => {
    const { edits } = pastePatches([['5'], ['6']], { row: 3, col: columns.length - 1 }, rows, [
      ...columns,
    ]);
    expect(edits).toHaveLength(1);
    expect(edits[0]!.strip.plotNumber).toBe(202);
  });
});

describe('fieldOrder and neighbours', () => {
  const strips = buildSiteStrips().strips;

  it('walks block by block, then by position', () => {
    expect(fieldOrder(strips).map((s) => s.plotNumber)).toEqual([101, 102, 201, 202]);
    expect(strips.map((s) => s.plotNumber)).toEqual([202, 201, 102, 101]);
  });

  it('finds the strips either side, across a block boundary, and none past the ends', () => {
    const byPlot = (n: number) => strips.find((s) => s.plotNumber === n)!.stripId;
    const around = (n: number) => {
      const { previous, next } = neighbours(strips, byPlot(n));
      return [previous?.plotNumber, next?.plotNumber];
    };
    expect(around(101)).toEqual([undefined, 102]);
    expect(around(102)).toEqual([101, 201]);
    expect(around(202)).toEqual([201, undefined]);
  });
});
