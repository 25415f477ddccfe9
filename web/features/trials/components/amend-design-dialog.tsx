// Asked when a sown trial's seed-weight fields change: the change goes through only as an
// amendment with a reason, which growers receive by e-mail and reports show.
import { useState, type FormEvent } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextAreaField } from '../../../components/ui/form-fields';

const FIELD_WORDS: Record<string, string> = {
  referenceRate: 'reference rate',
  referenceUnit: 'reference rate unit',
  thousandKernelWeightG: 'thousand-kernel weight',
  germinationPct: 'germination',
  emergencePct: 'expected emergence',
  rowsPerStrip: 'rows per strip',
  rowSpacingIn: 'row spacing',
  stripLengthFt: 'strip length',
};

export function AmendDesignDialog({
  fields,
  busy,
  error,
  onAmend,
  onCancel,
}: {
  fields: readonly string[];
  busy: boolean;
  error?: string;
  onAmend: (reason: string) => void;
  onCancel: () => void;
}) {
  const [reason, setReason] = useState('');
  function submit(event: FormEvent) {
    event.preventDefault();
    onAmend(reason.trim());
  }
  return (
    <div
      role="dialog"
      aria-modal="true"
      aria-labelledby="amend-title"
      className="fixed inset-0 z-40 flex items-end justify-center bg-ink/40 p-4 sm:items-center"
      data-testid="amend-design-dialog"
    >
      <form
        onSubmit={submit}
        className="w-full max-w-lg space-y-4 rounded-card bg-surface p-5 shadow-raised"
      >
        <h2 id="amend-title" className="text-heading text-ink">
          Amend a design that is already sown
        </h2>
        <p className="text-label text-ink-muted">
          Sowing has started, so changing the {fields.map((f) => FIELD_WORDS[f] ?? f).join(', ')}{' '}
          changes the seed weights in the growers’ packets and the establishment figures in the
          reports. If you go ahead, the packets are marked re-issued, every grower gets an e-mail
          with your reason, and the reports show the amendment.
        </p>
        <TextAreaField
          label="Why does the design change?"
          required
          rows={3}
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          error={error}
        />
        <Alert tone="caution">
          Growers who have already sown keep their data; ask them to note the change on their
          recording sheet.
        </Alert>
        <div className="flex flex-wrap justify-end gap-2">
          <Button type="button" variant="quiet" onClick={onCancel}>
            Keep the design as it was
          </Button>
          <Button type="submit" busy={busy} disabled={reason.trim().length < 5}>
            Amend and tell the growers
          </Button>
        </div>
      </form>
    </div>
  );
}
