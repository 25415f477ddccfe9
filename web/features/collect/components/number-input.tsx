// One strip value as a large phone-friendly input: keeps what is typed as text, saves valid
// values, and says under the box whether it is saved, waiting to be sent, or not saved and why.
import { useState } from 'react';
import type { ObservationValues } from '../../../../shared/schemas/observation';
import type { StripDto, StripValuesPatch } from '../../../../shared/schemas/strip';
import type { CellKind, ListField, ScalarField } from '../../../../shared/import/columns';
import { TextField } from '../../../components/ui/text-field';
import type { OutboxEntry } from '../lib/outbox';
import { cellText, patchForCell } from '../lib/strip-values';
import { clearUnsaved, fieldKey, markUnsaved, unsavedField } from '../lib/unsaved-fields';

export interface ValueInputProps {
  label: string;
  field: ScalarField | ListField;
  index?: number;
  kind: CellKind;
  values: ObservationValues;
  strip: Pick<StripDto, 'stripId' | 'siteId' | 'plotNumber'>;
  /** The strip's waiting edits, if any. */
  entry: OutboxEntry | undefined;
  onPatch: (patch: StripValuesPatch) => void;
  suffix?: string;
  hint?: string;
  disabled?: boolean;
  containerClassName?: string;
}

export type FieldState = { state: 'saved' | 'waiting' } | { state: 'not-saved'; why: string };

/** Saved, waiting (on this device, not yet on the server) or not saved with the reason. */
export function fieldState(
  entry: OutboxEntry | undefined,
  field: string,
  error: string | undefined,
): FieldState {
  if (error) return { state: 'not-saved', why: error };
  if (entry && field in entry.values) {
    if (entry.status === 'pending') return { state: 'waiting' };
    return { state: 'not-saved', why: entry.message ?? 'The server did not take it' };
  }
  return { state: 'saved' };
}

export function ValueInput({
  label,
  field,
  index,
  kind,
  values,
  strip,
  entry,
  onPatch,
  suffix,
  hint,
  disabled,
  containerClassName,
}: ValueInputProps) {
  const column = { field, index, kind };
  const key = fieldKey(strip.stripId, field, index);
  const [draft, setDraft] = useState<string | null>(() => unsavedField(key)?.text ?? null);
  const [error, setError] = useState<string | undefined>(() => unsavedField(key)?.message);
  const [touched, setTouched] = useState(false);
  const text = draft ?? cellText(values, column);
  const status = fieldState(entry, field, error);
  const statusText =
    status.state === 'waiting'
      ? 'Kept on this device, waiting to be sent'
      : status.state === 'saved' && touched
        ? 'Saved'
        : null;
  return (
    <div className={containerClassName}>
      <TextField
        label={label}
        hint={hint}
        suffix={suffix}
        error={status.state === 'not-saved' ? `Not saved: ${status.why}` : undefined}
        disabled={disabled}
        className="min-h-12 text-lead figures"
        type={kind === 'date' ? 'date' : 'text'}
        inputMode={kind === 'int' ? 'numeric' : kind === 'number' ? 'decimal' : undefined}
        autoComplete="off"
        enterKeyHint="next"
        data-state={status.state}
        value={text}
        onChange={(event) => {
          const next = event.target.value;
          setDraft(next);
          setTouched(true);
          const result = patchForCell(values, column, next);
          if ('error' in result) {
            setError(result.error);
            markUnsaved({
              key,
              siteId: strip.siteId,
              stripId: strip.stripId,
              place: `Plot ${strip.plotNumber}, ${label}`,
              text: next,
              message: result.error,
            });
            return;
          }
          setError(undefined);
          clearUnsaved(key);
          onPatch(result.patch);
        }}
        onBlur={() => {
          if (!error) setDraft(null);
        }}
      />
      {statusText ? (
        <p className="mt-1 text-caption text-ink-muted" data-testid="field-status">
          <span aria-hidden="true">{status.state === 'saved' ? '✓ ' : '● '}</span>
          {statusText}
        </p>
      ) : null}
    </div>
  );
}
