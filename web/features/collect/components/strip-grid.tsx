// The whole site as a grid (@tanstack/react-table v8): one Tab stop (the last cell used), arrow
// keys move inside, Enter moves down, and a block of cells pasted from a spreadsheet fills the
// strips and columns from the focused cell.
import { getCoreRowModel, useReactTable } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { SiteStrips } from '../../../../shared/schemas/strip';
import { valueColumns } from '../../../../shared/import/columns';
import { entryUnits } from '../../../../shared/units/strip-derived';
import { Alert } from '../../../components/ui/alert';
import { useOutbox } from '../lib/outbox';
import { fieldOrder } from '../lib/strip-order';
import { effectiveValues } from '../lib/strip-values';
import { useGridKeys, useGridPaste } from '../lib/use-grid-controls';
import { ActiveCell, type GridRow } from './grid-cell';
import { useGridColumns } from './grid-columns';
import { GridTable } from './grid-table';

/** The site's strips in field order, each with its waiting edits laid over the saved values. */
function useGridRows(data: SiteStrips): GridRow[] {
  const outbox = useOutbox();
  return useMemo(
    () =>
      fieldOrder(data.strips).map((strip) => {
        const entry = outbox.find((e) => e.stripId === strip.stripId);
        return { strip, values: effectiveValues(strip, entry), waiting: Boolean(entry) };
      }),
    [data.strips, outbox],
  );
}

export function StripGrid({ data }: { data: SiteStrips }) {
  const { site } = data;
  const columns = useMemo(
    () => valueColumns(site.unitSystem).filter((c) => c.kind !== 'date'),
    [site.unitSystem],
  );
  const rows = useGridRows(data);
  const { paste, pasteErrors } = useGridPaste(rows, columns);
  const keys = useGridKeys({ rows: rows.length, cols: columns.length });
  const table = useReactTable({
    data: rows,
    columns: useGridColumns(site, columns, paste),
    getCoreRowModel: getCoreRowModel(),
  });
  const units = entryUnits(site.unitSystem);

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
      <ActiveCell.Provider value={keys.activeCell}>
        <div
          className="overflow-x-auto rounded-card border border-line bg-surface shadow-card"
          onKeyDown={keys.onKeyDown}
          onFocus={keys.onFocus}
        >
          <GridTable table={table} />
        </div>
      </ActiveCell.Provider>
    </div>
  );
}
