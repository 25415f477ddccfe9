// A member's home: the trial reports their network has published, newest season first.
import type { TrialSummary } from '../../../../shared/schemas/trial';
import { EmptyState } from '../../../components/ui/empty-state';
import { cropName, plural } from '../../../lib/format';
import { Link } from 'react-router-dom';

export function ReportList({ trials }: { trials: readonly TrialSummary[] }) {
  if (trials.length === 0) {
    return (
      <EmptyState title="No reports published yet">
        Reports appear here once the coordinator publishes a trial’s results, usually before the
        winter meeting.
      </EmptyState>
    );
  }
  const sorted = [...trials].sort(
    (a, b) => (b.season ?? '').localeCompare(a.season ?? '') || a.name.localeCompare(b.name),
  );
  return (
    <ul className="divide-y divide-line overflow-hidden rounded-card border border-line bg-surface shadow-card">
      {sorted.map((trial) => (
        <li key={trial.id}>
          <Link
            to={`/trials/${trial.id}/report`}
            className="flex items-center gap-4 px-5 py-4 no-underline transition-colors hover:bg-accent-soft"
          >
            <span
              aria-hidden="true"
              className="figures flex size-12 shrink-0 flex-col items-center justify-center rounded-field bg-straw-100 text-straw-800 dark:bg-straw-900 dark:text-straw-100"
            >
              <span className="text-caption leading-none">season</span>
              <span className="text-label font-bold leading-tight">{trial.season ?? '—'}</span>
            </span>
            <span className="min-w-0 flex-1">
              <span className="block font-semibold text-ink">{trial.name}</span>
              <span className="block text-label text-ink-muted">
                {cropName(trial.crop)} · {plural(trial.siteCount, 'site')} · {trial.networkName}
              </span>
            </span>
            <span aria-hidden="true" className="text-heading text-accent">
              →
            </span>
          </Link>
        </li>
      ))}
    </ul>
  );
}
