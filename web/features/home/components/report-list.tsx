// A member's home: the reports their network has published, trial by trial, newest season first.
import { Link } from 'react-router-dom';
import type { TrialDetail } from '../../../../shared/schemas/trial';
import { EmptyState } from '../../../components/ui/empty-state';
import { cropName, formatDate } from '../../../lib/format';

const rowLink =
  'flex min-h-12 items-center gap-3 px-5 py-3 no-underline transition-colors hover:bg-accent-soft';

function Arrow() {
  return (
    <span aria-hidden="true" className="ml-auto text-heading text-accent">
      →
    </span>
  );
}

export function ReportList({ trials }: { trials: readonly TrialDetail[] }) {
  const withReports = trials.filter(
    (t) => t.pooledPublishedAt || t.sites.some((s) => s.publishedAt),
  );
  if (withReports.length === 0) {
    return (
      <EmptyState title="No reports published yet">
        Reports appear here once the coordinator publishes a trial’s results, usually before the
        winter meeting.
      </EmptyState>
    );
  }
  const sorted = [...withReports].sort(
    (a, b) => (b.season ?? '').localeCompare(a.season ?? '') || a.name.localeCompare(b.name),
  );
  return (
    <div className="space-y-6">
      {sorted.map((trial) => {
        const sites = trial.sites.filter((s) => s.publishedAt);
        return (
          <section
            key={trial.id}
            aria-labelledby={`reports-${trial.id}`}
            className="overflow-hidden rounded-card border border-line bg-surface shadow-card"
            data-testid="trial-reports"
          >
            <div className="flex items-center gap-4 border-b border-line bg-sunken/60 px-5 py-4">
              <span
                aria-hidden="true"
                className="figures flex size-12 shrink-0 flex-col items-center justify-center rounded-field bg-straw-100 text-straw-800 dark:bg-straw-900 dark:text-straw-100"
              >
                <span className="text-caption leading-none">season</span>
                <span className="text-label font-bold leading-tight">{trial.season ?? '—'}</span>
              </span>
              <div className="min-w-0">
                <h2 id={`reports-${trial.id}`} className="text-heading text-ink">
                  {trial.name}
                </h2>
                <p className="text-label text-ink-muted">
                  {cropName(trial.crop)} · {trial.networkName}
                </p>
              </div>
            </div>
            <ul className="divide-y divide-line">
              {trial.pooledPublishedAt ? (
                <li>
                  <Link to={`/trials/${trial.id}/report`} className={rowLink}>
                    <span className="min-w-0">
                      <span className="block font-semibold text-ink">Network report</span>
                      <span className="block text-label text-ink-muted">
                        All sites pooled · published {formatDate(trial.pooledPublishedAt)}
                      </span>
                    </span>
                    <Arrow />
                  </Link>
                </li>
              ) : null}
              {sites.map((site) => (
                <li key={site.id}>
                  <Link to={`/sites/${site.id}/report`} className={rowLink}>
                    <span className="min-w-0">
                      <span className="block font-semibold text-ink">
                        Site report: {site.fieldName}
                      </span>
                      <span className="block text-label text-ink-muted">
                        {site.growerName ?? 'Grower not named'} · published{' '}
                        {formatDate(site.publishedAt)}
                      </span>
                    </span>
                    <Arrow />
                  </Link>
                </li>
              ))}
            </ul>
          </section>
        );
      })}
    </div>
  );
}
