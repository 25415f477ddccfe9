// The whole site as a grid (@tanstack/react-table v8): one Tab stop (the last cell used), arrow
// keys move inside, Enter moves down, and a block of cells pasted from a spreadsheet fills the
// strips and columns from the focused cell.
import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  useReactTable,
  type ColumnDef,
} from '@tanstack/react-table';
import {
  createContext,
  useContext,
  useMemo,
  useRef,
  useState,
  type ClipboardEvent,
  type KeyboardEvent,
} from 'react';
import type { ObservationValues } from '../../../../shared/schemas/observation';
import type { SiteStrips, StripDto, StripValuesPatch } from '../../../../shared/schemas/strip';
import { valueColumns, type ValueColumn } from '../../../../shared/import/columns';
import { entryUnits } from '../../../../shared/units/strip-derived';
import { Alert } from '../../../components/ui/alert';
import { cn } from '../../../lib/cn';
import { queueEdit, useOutbox } from '../lib/outbox';
import { clearUnsaved, fieldKey, markUnsaved, unsavedField } from '../lib/unsaved-fields';
import {
  cellText,
  effectiveValues,
  formatNumber,
  liveDerived,
  patchForCell,
} from '../lib/strip-values';

interface GridRow {
  strip: StripDto;
  values: ObservationValues;
  waiting: boolean;
}

const columnHelper = createColumnHelper<GridRow>();

const UNITS = {
  imperial: { length: 'ft', weight: 'lb', area: 'ft²', testWeight: 'lb/bu' },
  metric: { length: 'm', weight: 'kg', area: 'm²', testWeight: 'kg/hl' },
} as const;

/** A short plain heading for a grid column; the CSV column name stays in the tooltip. */
function gridLabel(column: ValueColumn, system: 'imperial' | 'metric'): string {
  const u = UNITS[system];
  const n = column.index === undefined ? '' : ` ${column.index + 1}`;
  switch (column.field) {
    case 'seedsSown':
      return 'Seeds sown';
    case 'standCounts':
      return `Stand${n}`;
    case 'standRowLength':
      return `Stand row (${u.length})`;
    case 'tillerPlants':
      return 'Plants for tillers';
    case 'tillerCount':
      return 'Tillers';
    case 'headCounts':
      return `Heads${n}`;
    case 'headRowLength':
      return `Head row (${u.length})`;
    case 'grainWeight':
      return `Grain (${u.weight})`;
    case 'harvestRows':
      return 'Rows harvested';
    case 'harvestLength':
      return `Length harvested (${u.length})`;
    case 'harvestArea':
      return `Area harvested (${u.area})`;
    case 'moisturePct':
      return 'Moisture %';
    case 'testWeight':
      return `Test weight (${u.testWeight})`;
    case 'notes':
      return 'Notes';
    default:
      return column.header;
  }
}

/** The cell that holds the grid's one Tab stop, as "row:col". */
const ActiveCell = createContext('0:0');

function focusCell(row: number, col: number) {
  const input = document.querySelector<HTMLInputElement>(`[data-cell="${row}:${col}"]`);
  if (input) {
    input.focus();
    input.select();
  }
}

function GridCell({
  row,
  col,
  data,
  column,
  label,
  disabled,
  onPaste,
}: {
  row: number;
  col: number;
  data: GridRow;
  column: ValueColumn;
  label: string;
  disabled: boolean;
  onPaste: (event: ClipboardEvent<HTMLInputElement>, row: number, col: number) => void;
}) {
  const key = fieldKey(data.strip.stripId, column.field, column.index);
  const [draft, setDraft] = useState<string | null>(() => unsavedField(key)?.text ?? null);
  const [error, setError] = useState<string | undefined>(() => unsavedField(key)?.message);
  const active = useContext(ActiveCell) === `${row}:${col}`;
  const text = draft ?? cellText(data.values, column);
  return (
    <input
      data-cell={`${row}:${col}`}
      tabIndex={active ? 0 : -1}
      aria-label={`Plot ${data.strip.plotNumber}, ${label}${error ? `, not saved: ${error}` : ''}`}
      aria-invalid={error ? true : undefined}
      title={error ? `Not saved: ${error}` : undefined}
      disabled={disabled}
      inputMode={
        column.kind === 'int' ? 'numeric' : column.kind === 'number' ? 'decimal' : undefined
      }
      autoComplete="off"
      value={text}
      className={cn(
        'figures h-10 w-full min-w-16 bg-transparent px-2 text-right text-body text-ink focus:bg-accent-soft focus:outline-none focus:ring-2 focus:ring-inset focus:ring-accent',
        column.kind === 'text' && 'min-w-48 text-left',
        error && 'bg-danger-soft ring-2 ring-inset ring-danger',
      )}
      onChange={(event) => {
        const next = event.target.value;
        setDraft(next);
        const result = patchForCell(data.values, column, next);
        if ('error' in result) {
          setError(result.error);
          markUnsaved({
            key,
            siteId: data.strip.siteId,
            stripId: data.strip.stripId,
            place: `Plot ${data.strip.plotNumber}, ${label}`,
            text: next,
            message: result.error,
          });
          return;
        }
        setError(undefined);
        clearUnsaved(key);
        queueEdit(data.strip, result.patch);
      }}
      onBlur={() => {
        if (!error) setDraft(null);
      }}
      onPaste={(event) => onPaste(event, row, col)}
    />
  );
}

export function StripGrid({ data }: { data: SiteStrips }) {
  const { site } = data;
  const outbox = useOutbox();
  const [pasteErrors, setPasteErrors] = useState<string[]>([]);
  const [activeCell, setActiveCell] = useState('0:0');
  const columns = useMemo(
    () => valueColumns(site.unitSystem).filter((c) => c.kind !== 'date'),
    [site.unitSystem],
  );
  const units = entryUnits(site.unitSystem);
  const rows: GridRow[] = useMemo(
    () =>
      [...data.strips]
        .sort((a, b) => a.block - b.block || a.position - b.position)
        .map((strip) => {
          const entry = outbox.find((e) => e.stripId === strip.stripId);
          return { strip, values: effectiveValues(strip, entry), waiting: Boolean(entry) };
        }),
    [data.strips, outbox],
  );
  const disabled = !site.canEdit;

  // Cell renderers are component types to react-table's flexRender: they must stay the same
  // function between renders (or inputs remount and lose focus), so paste reads rows from a ref.
  const rowsRef = useRef(rows);
  rowsRef.current = rows;
  const pasteRef = useRef<
    (event: ClipboardEvent<HTMLInputElement>, row: number, col: number) => void
  >(() => {});
  pasteRef.current = (event, row, col) => {
    const rows = rowsRef.current;
    const text = event.clipboardData.getData('text/plain');
    if (!/[\t\n]/.test(text.replace(/\r?\n$/, ''))) return;
    event.preventDefault();
    const block = text
      .replace(/\r/g, '')
      .replace(/\n$/, '')
      .split('\n')
      .map((line) => line.split('\t'));
    const errors: string[] = [];
    const pending = new Map<
      string,
      { strip: StripDto; values: ObservationValues; patch: StripValuesPatch }
    >();
    block.forEach((cells, i) => {
      const target = rows[row + i];
      if (!target) return;
      const state = pending.get(target.strip.stripId) ?? {
        strip: target.strip,
        values: target.values,
        patch: {},
      };
      cells.forEach((cell, j) => {
        const column = columns[col + j];
        if (!column) return;
        const result = patchForCell(state.values, column, cell);
        if ('error' in result) {
          errors.push(
            `Plot ${target.strip.plotNumber}, ${column.header}: ${result.error} ("${cell.slice(0, 20)}")`,
          );
          return;
        }
        state.values = { ...state.values, ...result.patch };
        state.patch = { ...state.patch, ...result.patch };
      });
      pending.set(target.strip.stripId, state);
    });
    for (const { strip, patch } of pending.values())
      if (Object.keys(patch).length > 0) queueEdit(strip, patch);
    setPasteErrors(errors);
  };
  const paste = (event: ClipboardEvent<HTMLInputElement>, row: number, col: number) =>
    pasteRef.current(event, row, col);

  const keyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    const target = event.target as HTMLInputElement;
    const cell = target.dataset?.cell;
    if (!cell) return;
    const [row, col] = cell.split(':').map(Number) as [number, number];
    const last = columns.length - 1;
    const atStart = target.selectionStart === 0 && target.selectionEnd === 0;
    const atEnd = target.selectionStart === target.value.length;
    if (event.key === 'ArrowDown' || (event.key === 'Enter' && !event.shiftKey)) {
      event.preventDefault();
      focusCell(row + 1, col);
    } else if (event.key === 'ArrowUp' || (event.key === 'Enter' && event.shiftKey)) {
      event.preventDefault();
      focusCell(row - 1, col);
    } else if (event.key === 'ArrowLeft' && (atStart || target.selectionStart === null)) {
      event.preventDefault();
      focusCell(row, col - 1);
    } else if (event.key === 'ArrowRight' && (atEnd || target.selectionStart === null)) {
      event.preventDefault();
      focusCell(row, col + 1);
    } else if (event.key === 'Home' && event.ctrlKey) {
      event.preventDefault();
      focusCell(0, 0);
    } else if (event.key === 'End' && event.ctrlKey) {
      event.preventDefault();
      focusCell(rows.length - 1, last);
    }
  };

  const tableColumns = useMemo<ColumnDef<GridRow, unknown>[]>(
    () => [
      columnHelper.display({
        id: 'strip',
        header: 'Plot',
        cell: ({ row }) => (
          <span className="block whitespace-nowrap px-2 text-label">
            <span className="font-semibold">{row.original.strip.plotNumber}</span>{' '}
            <span className="text-ink-muted">{row.original.strip.label}</span>
            {row.original.waiting ? (
              <span className="ml-1 text-caution" title="Waiting to be sent">
                ●
              </span>
            ) : null}
          </span>
        ),
      }),
      ...columns.map((column, col) =>
        columnHelper.display({
          id: column.header,
          header: () => (
            <span
              title={`${column.meaning} (CSV column ${column.header})`}
              className="whitespace-nowrap"
            >
              {gridLabel(column, site.unitSystem)}
            </span>
          ),
          cell: ({ row }) => (
            <GridCell
              key={row.original.strip.stripId}
              row={row.index}
              col={col}
              data={row.original}
              column={column}
              label={gridLabel(column, site.unitSystem)}
              disabled={disabled}
              onPaste={paste}
            />
          ),
        }),
      ),
      columnHelper.display({
        id: 'plants',
        header: site.unitSystem === 'metric' ? 'plants/m²' : 'plants/ft²',
        cell: ({ row }) => {
          const { derived } = liveDerived(site, row.original.strip, row.original.values);
          return (
            <span className="figures block px-2 text-right">
              {formatNumber(
                site.unitSystem === 'metric'
                  ? derived.plantsPerSquareMetre
                  : derived.plantsPerSquareFoot,
              )}
            </span>
          );
        },
      }),
      columnHelper.display({
        id: 'yield',
        header: site.unitSystem === 'metric' ? 'Yield t/ha' : 'Yield bu/acre',
        cell: ({ row }) => {
          const { derived, warnings } = liveDerived(site, row.original.strip, row.original.values);
          return (
            <span
              className="figures block px-2 text-right font-semibold"
              title={warnings.join('\n')}
            >
              {site.unitSystem === 'metric'
                ? formatNumber(
                    derived.yieldKilogramsPerHectare === null
                      ? null
                      : derived.yieldKilogramsPerHectare / 1000,
                    2,
                  )
                : formatNumber(derived.yieldBushelsPerAcre)}
              {warnings.length > 0 ? <span className="ml-1 text-danger">▲</span> : null}
            </span>
          );
        },
      }),
    ],
    [columns, site, disabled],
  );

  const table = useReactTable({
    data: rows,
    columns: tableColumns,
    getCoreRowModel: getCoreRowModel(),
  });

  return (
    <div className="space-y-3">
      <p className="text-label text-ink-muted">
        Units: lengths in {units.length}, weight in {units.weight}, area in {units.area}. Yield is
        at the crop’s standard moisture. The grid is one stop for the Tab key: arrow keys move
        between cells, Enter moves down, Tab leaves the grid, and you can paste a block of cells
        copied from a spreadsheet.
      </p>
      {pasteErrors.length > 0 ? (
        <Alert tone="danger" title="Some pasted cells were not taken">
          <ul className="list-disc pl-4">
            {pasteErrors.slice(0, 10).map((e) => (
              <li key={e}>{e}</li>
            ))}
          </ul>
        </Alert>
      ) : null}
      <ActiveCell.Provider value={activeCell}>
        <div
          className="overflow-x-auto rounded-card border border-line bg-surface shadow-card"
          onKeyDown={keyDown}
          onFocus={(event) => {
            const cell = (event.target as HTMLElement).dataset?.cell;
            if (cell && cell !== activeCell) setActiveCell(cell);
          }}
        >
          <table className="border-collapse text-body" data-testid="strip-grid">
            <thead className="bg-sunken">
              {table.getHeaderGroups().map((group) => (
                <tr key={group.id}>
                  {group.headers.map((header, i) => (
                    <th
                      key={header.id}
                      scope="col"
                      className={cn(
                        'border-b border-line px-2 py-2 text-left text-caption font-semibold text-ink-muted',
                        i === 0 && 'sticky left-0 z-10 bg-sunken',
                      )}
                    >
                      {flexRender(header.column.columnDef.header, header.getContext())}
                    </th>
                  ))}
                </tr>
              ))}
            </thead>
            <tbody>
              {table.getRowModel().rows.map((row) => (
                <tr
                  key={row.id}
                  className={cn(
                    row.original.strip.position === 1 &&
                      row.index > 0 &&
                      'border-t-2 border-line-strong',
                  )}
                >
                  {row.getVisibleCells().map((cell, i) => (
                    <td
                      key={cell.id}
                      className={cn(
                        'border-b border-r border-line p-0',
                        i === 0 && 'sticky left-0 z-10 bg-surface',
                      )}
                    >
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </ActiveCell.Provider>
    </div>
  );
}
