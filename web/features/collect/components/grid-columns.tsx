// The strip grid's columns (@tanstack/react-table v8): the plot, one editable column per value
// in the trial's units, and the live plants per area and yield worked out from them.
import { createColumnHelper, type ColumnDef } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { SiteContext } from '../../../../shared/schemas/strip';
import type { ValueColumn } from '../../../../shared/import/columns';
import type { UnitSystem } from '../../../../shared/schemas/trial';
import { entryUnits } from '../../../../shared/units/strip-derived';
import { formatNumber, liveDerived } from '../lib/strip-values';
import type { PasteHandler } from '../lib/use-grid-controls';
import { GridCell, type GridRow } from './grid-cell';

const columnHelper = createColumnHelper<GridRow>();

/** A short plain heading for a grid column; the CSV column name stays in the tooltip. */
export function gridLabel(column: ValueColumn, system: UnitSystem): string {
  const u = entryUnits(system);
  const n = column.index === undefined ? '' : ` ${column.index + 1}`;
  const labels: Partial<Record<ValueColumn['field'], string>> = {
    seedsSown: 'Seeds sown',
    standCounts: `Stand${n}`,
    standRowLength: `Stand row (${u.length})`,
    tillerPlants: 'Plants for tillers',
    tillerCount: 'Tillers',
    headCounts: `Heads${n}`,
    headRowLength: `Head row (${u.length})`,
    grainWeight: `Grain (${u.weight})`,
    harvestRows: 'Rows harvested',
    harvestLength: `Length harvested (${u.length})`,
    harvestArea: `Area harvested (${u.area})`,
    moisturePct: 'Moisture %',
    testWeight: `Test weight (${u.testWeight})`,
    notes: 'Notes',
  };
  return labels[column.field] ?? column.header;
}

function PlotCell({ row }: { row: GridRow }) {
  return (
    <span className="block whitespace-nowrap px-2 text-label">
      <span className="font-semibold">{row.strip.plotNumber}</span>{' '}
      <span className="text-ink-muted">{row.strip.label}</span>
      {row.waiting ? (
        <span className="ml-1 text-caution" title="Waiting to be sent">
          ●
        </span>
      ) : null}
    </span>
  );
}

function PlantsCell({ site, row }: { site: SiteContext; row: GridRow }) {
  const { derived } = liveDerived(site, row.strip, row.values);
  return (
    <span className="figures block px-2 text-right">
      {formatNumber(
        site.unitSystem === 'metric' ? derived.plantsPerSquareMetre : derived.plantsPerSquareFoot,
      )}
    </span>
  );
}

function YieldCell({ site, row }: { site: SiteContext; row: GridRow }) {
  const { derived, warnings } = liveDerived(site, row.strip, row.values);
  const kilograms = derived.yieldKilogramsPerHectare;
  return (
    <span className="figures block px-2 text-right font-semibold" title={warnings.join('\n')}>
      {site.unitSystem === 'metric'
        ? formatNumber(kilograms === null ? null : kilograms / 1000, 2)
        : formatNumber(derived.yieldBushelsPerAcre)}
      {warnings.length > 0 ? <span className="ml-1 text-danger">▲</span> : null}
    </span>
  );
}

/** The table's column definitions; stable while the site, columns and paste handler are. */
export function useGridColumns(
  site: SiteContext,
  columns: readonly ValueColumn[],
  paste: PasteHandler,
): ColumnDef<GridRow, unknown>[] {
  const disabled = !site.canEdit;
  return useMemo<ColumnDef<GridRow, unknown>[]>(() => {
    const metric = site.unitSystem === 'metric';
    return [
      columnHelper.display({
        id: 'strip',
        header: 'Plot',
        cell: ({ row }) => <PlotCell row={row.original} />,
      }),
      ...columns.map((column, col) => {
        const label = gridLabel(column, site.unitSystem);
        return columnHelper.display({
          id: column.header,
          header: () => (
            <span
              title={`${column.meaning} (CSV column ${column.header})`}
              className="whitespace-nowrap"
            >
              {label}
            </span>
          ),
          cell: ({ row }) => (
            <GridCell
              key={row.original.strip.stripId}
              row={row.index}
              col={col}
              data={row.original}
              column={column}
              label={label}
              disabled={disabled}
              onPaste={paste}
            />
          ),
        });
      }),
      columnHelper.display({
        id: 'plants',
        header: metric ? 'plants/m²' : 'plants/ft²',
        cell: ({ row }) => <PlantsCell site={site} row={row.original} />,
      }),
      columnHelper.display({
        id: 'yield',
        header: metric ? 'Yield t/ha' : 'Yield bu/acre',
        cell: ({ row }) => <YieldCell site={site} row={row.original} />,
      }),
    ];
  }, [columns, site, disabled, paste]);
}
