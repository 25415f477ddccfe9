// On a report: the design changed after sowing, when, why and what, so readers weigh the
// establishment figures knowingly.
import { Alert } from '../../../components/ui/alert';
import { useReportAmendments } from '../api/get-amendments';

const FIELD_WORDS: Record<string, string> = {
  referenceRate: 'reference rate',
  referenceUnit: 'reference rate unit',
  thousandKernelWeightG: 'thousand-kernel weight (g)',
  germinationPct: 'germination (%)',
  emergencePct: 'expected emergence (%)',
  rowsPerStrip: 'rows per strip',
  rowSpacingIn: 'row spacing (in)',
  stripLengthFt: 'strip length (ft)',
};
const day = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });
const show = (v: unknown) => (v === null || v === undefined ? 'not set' : String(v));

export function AmendmentsNotice({ trialId }: { trialId: string }) {
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
            {a.changes
              .map((c) => `${FIELD_WORDS[c.field] ?? c.field} ${show(c.from)} → ${show(c.to)}`)
              .join('; ')}
            . Reason: {a.reason}
          </li>
        ))}
      </ul>
      Seed weights and establishment figures use the amended design; strips sown before the change
      were sown with the earlier seed weights.
    </Alert>
  );
}
