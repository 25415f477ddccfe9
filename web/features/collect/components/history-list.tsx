// A site's change history for the coordinator: who changed which values, from what to what.
import type { AuditEventDto } from '../../../../shared/schemas/strip';
import { EmptyState } from '../../../components/ui/empty-state';
import { plotNumber } from '../../../../shared/units/plot-number';
import { formatDateTime } from '../../../lib/format';
import { FIELD_LABELS } from '../lib/strip-values';

const show = (value: unknown) =>
  value === null || value === undefined || value === ''
    ? '—'
    : Array.isArray(value)
      ? value.join(', ') || '—'
      : String(value);
const label = (key: string) => (FIELD_LABELS as Record<string, string>)[key] ?? key;
const ACTIONS: Record<string, string> = {
  update: 'edited',
  import: 'uploaded a CSV that changed',
  upload: 'added a photo to',
};

export function HistoryList({ events }: { events: AuditEventDto[] }) {
  if (events.length === 0)
    return (
      <EmptyState title="No changes yet">
        Every change to this site’s numbers shows up here, with who made it.
      </EmptyState>
    );
  return (
    <ol className="space-y-3" data-testid="history">
      {events.map((event) => (
        <li key={event.id} className="rounded-card border border-line bg-surface p-4 shadow-card">
          <p className="text-label">
            <span className="font-semibold text-ink">
              {event.actorName ?? event.actorEmail ?? 'Someone'}
            </span>{' '}
            <span className="text-ink-muted">{ACTIONS[event.action] ?? event.action}</span>{' '}
            <span className="font-semibold text-ink">
              {event.strip
                ? `plot ${plotNumber(event.strip.block, event.strip.position)} (${event.strip.label})`
                : event.entityType === 'site'
                  ? 'the site'
                  : event.entityType}
            </span>
            <span className="block text-caption text-ink-muted">
              {formatDateTime(event.createdAt)}
            </span>
          </p>
          {event.after ? (
            <table className="mt-2 w-full table-fixed text-left text-caption">
              <thead>
                <tr className="text-ink-muted">
                  <th scope="col" className="w-1/2 py-1 pr-2 font-medium sm:w-1/3">
                    Value
                  </th>
                  <th scope="col" className="py-1 pr-2 font-medium">
                    Before
                  </th>
                  <th scope="col" className="py-1 font-medium">
                    After
                  </th>
                </tr>
              </thead>
              <tbody>
                {Object.keys(event.after).map((key) => (
                  <tr key={key} className="border-t border-line">
                    <th scope="row" className="py-1 pr-2 font-medium text-ink-muted">
                      {label(key)}
                    </th>
                    <td className="figures break-words py-1 pr-2 text-ink-muted line-through decoration-ink-muted/40">
                      {show(event.before?.[key])}
                    </td>
                    <td className="figures break-words py-1 font-semibold text-ink">
                      {show(event.after?.[key])}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          ) : null}
        </li>
      ))}
    </ol>
  );
}
