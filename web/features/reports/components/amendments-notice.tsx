// On a report: the design changed after sowing, when, why and what, so readers weigh the
// establishment figures knowingly.
import { Alert } from '../../../components/ui/alert';
import type { DesignAmendment, UnitSystem } from '../../../../shared/schemas/trial';
import { designUnits } from '../../../../shared/units/design-units';
import { useReportAmendments } from '../api/get-amendments';

const FIELD_WORDS: Record<string, string> = {
  referenceRate: 'reference rate',
  referenceUnit: 'reference rate unit',
  thousandKernelWeightG: 'thousand-kernel weight (g)',
  germinationPct: 'germination (%)',
  emergencePct: 'expected emergence (%)',
  rowsPerStrip: 'rows per strip',
};
const day = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });
const show = (v: unknown) => (v === null || v === undefined ? 'not set' : String(v));

/** A changed field in words, lengths in the trial's units (stored in inches and feet). */
function changeText(change: DesignAmendment['changes'][number], system: UnitSystem): string {
  const units = designUnits(system);
  const length =
    change.field === 'rowSpacingIn'
      ? { words: 'row spacing', unit: units.rowSpacing }
      : change.field === 'stripLengthFt'
        ? { words: 'strip length', unit: units.stripLength }
        : null;
  if (!length)
    return `${FIELD_WORDS[change.field] ?? change.field} ${show(change.from)} → ${show(change.to)}`;
  const value = (v: unknown) =>
    typeof v === 'number' ? String(Number(length.unit.fromStored(v).toFixed(1))) : show(v);
  return `${length.words} (${length.unit.unit}) ${value(change.from)} → ${value(change.to)}`;
}

export function AmendmentsNotice({ trialId, system }: { trialId: string; system: UnitSystem }) {
  const { data } = useReportAmendments(trialId);
  if (!data || data.length === 0) return null;
  return (
    <Alert
      tone="caution"
      title={
        data.length === 1
          ? 'The design was amended after sowing'
          : `The design was amended ${data.length} times after sowing`
      }
      className="no-print-break mb-6"
    >
      <ul className="space-y-1" data-testid="amendments">
        {data.map((a) => (
          <li key={a.id}>
            {day.format(new Date(a.at))}
            {a.byName ? `, ${a.byName}` : ''}:{' '}
            {a.changes.map((c) => changeText(c, system)).join('; ')}. Reason: {a.reason}
          </li>
        ))}
      </ul>
      Seed weights and establishment figures use the amended design; strips sown before the change
      were sown with the earlier seed weights.
    </Alert>
  );
}
