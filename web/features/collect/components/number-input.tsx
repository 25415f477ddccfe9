// One strip value as a large phone-friendly input: keeps what is typed as text, saves valid values.
import { useState } from 'react';
import type { ObservationValues } from '../../../../shared/schemas/observation';
import type { StripValuesPatch } from '../../../../shared/schemas/strip';
import type { CellKind, ListField, ScalarField } from '../../../../shared/import/columns';
import { TextField } from '../../../components/ui/text-field';
import { cellText, patchForCell } from '../lib/strip-values';

export interface ValueInputProps {
  label: string;
  field: ScalarField | ListField;
  index?: number;
  kind: CellKind;
  values: ObservationValues;
  onPatch: (patch: StripValuesPatch) => void;
  suffix?: string;
  hint?: string;
  disabled?: boolean;
  containerClassName?: string;
}

export function ValueInput({
  label,
  field,
  index,
  kind,
  values,
  onPatch,
  suffix,
  hint,
  disabled,
  containerClassName,
}: ValueInputProps) {
  const column = { field, index, kind };
  const [draft, setDraft] = useState<string | null>(null);
  const [error, setError] = useState<string | undefined>();
  const text = draft ?? cellText(values, column);
  return (
    <TextField
      label={label}
      hint={hint}
      suffix={suffix}
      error={error}
      disabled={disabled}
      containerClassName={containerClassName}
      className="min-h-12 text-lead figures"
      type={kind === 'date' ? 'date' : 'text'}
      inputMode={kind === 'int' ? 'numeric' : kind === 'number' ? 'decimal' : undefined}
      pattern={kind === 'int' ? '[0-9]*' : undefined}
      autoComplete="off"
      enterKeyHint="next"
      value={text}
      onChange={(event) => {
        const next = event.target.value;
        setDraft(next);
        const result = patchForCell(values, column, next);
        if ('error' in result) {
          setError(result.error);
          return;
        }
        setError(undefined);
        onPatch(result.patch);
      }}
      onBlur={() => {
        if (!error) setDraft(null);
      }}
    />
  );
}
