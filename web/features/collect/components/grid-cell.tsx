// One editable cell of the strip grid: keeps typed text that cannot be saved (with why, in its
// name and tooltip), queues what can be saved, and holds the grid's Tab stop when it is active.
import { createContext, useContext, useState } from 'react';
import type { ObservationValues } from '../../../../shared/schemas/observation';
import type { StripDto } from '../../../../shared/schemas/strip';
import type { ValueColumn } from '../../../../shared/import/columns';
import { cn } from '../../../lib/cn';
import { cellName } from '../lib/grid-navigation';
import { queueEdit } from '../lib/outbox';
import { cellText, patchForCell } from '../lib/strip-values';
import { clearUnsaved, fieldKey, markUnsaved, unsavedField } from '../lib/unsaved-fields';
import type { PasteHandler } from '../lib/use-grid-controls';

export interface GridRow {
  strip: StripDto;
  values: ObservationValues;
  waiting: boolean;
}

/** The cell that holds the grid's one Tab stop, as "row:col". */
export const ActiveCell = createContext('0:0');

const inputMode = (kind: ValueColumn['kind']) =>
  kind === 'int' ? 'numeric' : kind === 'number' ? 'decimal' : undefined;

export function GridCell({
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
  onPaste: PasteHandler;
}) {
  const key = fieldKey(data.strip.stripId, column.field, column.index);
  const [draft, setDraft] = useState<string | null>(() => unsavedField(key)?.text ?? null);
  const [error, setError] = useState<string | undefined>(() => unsavedField(key)?.message);
  const name = cellName({ row, col });
  const active = useContext(ActiveCell) === name;
  const place = `Plot ${data.strip.plotNumber}, ${label}`;

  const onChange = (next: string) => {
    setDraft(next);
    const result = patchForCell(data.values, column, next);
    if ('error' in result) {
      setError(result.error);
      markUnsaved({
        key,
        siteId: data.strip.siteId,
        stripId: data.strip.stripId,
        place,
        text: next,
        message: result.error,
      });
      return;
    }
    setError(undefined);
    clearUnsaved(key);
    queueEdit(data.strip, result.patch);
  };

  return (
    <input
      data-cell={name}
      tabIndex={active ? 0 : -1}
      aria-label={`${place}${error ? `, not saved: ${error}` : ''}`}
      aria-invalid={error ? true : undefined}
      title={error ? `Not saved: ${error}` : undefined}
      disabled={disabled}
      inputMode={inputMode(column.kind)}
      autoComplete="off"
      value={draft ?? cellText(data.values, column)}
      className={cn(
        'figures h-10 w-full min-w-16 bg-transparent px-2 text-right text-body text-ink focus:bg-accent-soft focus:outline-none focus:ring-2 focus:ring-inset focus:ring-accent',
        column.kind === 'text' && 'min-w-48 text-left',
        error && 'bg-danger-soft ring-2 ring-inset ring-danger',
      )}
      onChange={(event) => onChange(event.target.value)}
      onBlur={() => {
        if (!error) setDraft(null);
      }}
      onPaste={(event) => onPaste(event, { row, col })}
    />
  );
}
