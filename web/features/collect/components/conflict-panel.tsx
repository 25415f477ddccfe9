// What to do when a strip's edits were refused: someone saved first (409), or the report is out (423).
import type { ObservationValues } from '../../../../shared/schemas/observation';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { discardEdits, overwriteWithMine, type OutboxEntry } from '../lib/outbox';
import { FIELD_LABELS } from '../lib/strip-values';

const show = (value: unknown) =>
  value === null || value === undefined || value === ''
    ? '—'
    : Array.isArray(value)
      ? value.join(', ') || '—'
      : String(value);

export function ConflictPanel({ entry }: { entry: OutboxEntry }) {
  if (entry.status === 'pending') return null;
  if (entry.status === 'conflict') {
    const keys = Object.keys(entry.values) as (keyof ObservationValues)[];
    return (
      <Alert
        tone="danger"
        title="Someone else saved this strip after you opened it"
        action={
          <div className="flex flex-wrap gap-2">
            <Button variant="secondary" onClick={() => discardEdits(entry.stripId)}>
              Reload their values
            </Button>
            <Button
              variant="danger"
              onClick={() => overwriteWithMine(entry.stripId)}
              disabled={!entry.current}
            >
              Save mine over theirs
            </Button>
          </div>
        }
      >
        <p>Your changes are kept on this device until you choose.</p>
        {entry.current ? (
          <table className="mt-2 w-full text-left text-caption">
            <thead>
              <tr>
                <th className="py-1 pr-2 font-semibold">Value</th>
                <th className="py-1 pr-2 font-semibold">Theirs</th>
                <th className="py-1 font-semibold">Yours</th>
              </tr>
            </thead>
            <tbody>
              {keys.map((key) => (
                <tr key={key} className="border-t border-danger/20">
                  <td className="py-1 pr-2">{FIELD_LABELS[key]}</td>
                  <td className="figures py-1 pr-2">{show(entry.current!.values[key])}</td>
                  <td className="figures py-1 font-semibold">{show(entry.values[key])}</td>
                </tr>
              ))}
            </tbody>
          </table>
        ) : null}
      </Alert>
    );
  }
  return (
    <Alert
      tone="danger"
      title={
        entry.status === 'locked'
          ? 'This site’s data is read-only now'
          : 'These changes were not accepted'
      }
      action={
        <Button variant="secondary" onClick={() => discardEdits(entry.stripId)}>
          Discard my changes
        </Button>
      }
    >
      {entry.message}
    </Alert>
  );
}
