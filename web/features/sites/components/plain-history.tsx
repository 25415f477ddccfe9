// A site's history as sentences with the time in the reader's own time zone
// ("Ina Bell changed the threshed grain weight of plot 203 from 4.1 to 4.2 lb · 14 Aug 2027, 18:05").
import type { HistoryEntry } from '../../../../shared/schemas/history';
import { EmptyState } from '../../../components/ui/empty-state';

const when = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
});

export function PlainHistory({ entries }: { entries: readonly HistoryEntry[] }) {
  if (entries.length === 0)
    return (
      <EmptyState title="No changes yet">
        Every change to this site shows up here, with who made it and when.
      </EmptyState>
    );
  return (
    <ol className="space-y-2" data-testid="history">
      {entries.map((e) => (
        <li key={e.id} className="rounded-card border border-line bg-surface p-3 shadow-card">
          <p className="text-label text-ink">{e.sentence}</p>
          <p className="figures text-caption text-ink-muted">{when.format(new Date(e.at))}</p>
        </li>
      ))}
    </ol>
  );
}
