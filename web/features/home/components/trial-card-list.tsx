// The coordinator's home: every trial they run as a card with crop, season, status and sites.
import type { TrialStatus, TrialSummary } from '../../../../shared/schemas/trial';
import { Badge, type BadgeTone } from '../../../components/ui/badge';
import { ButtonLink } from '../../../components/ui/button';
import { LinkCard } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { cropName, plural, trialStatusName } from '../../../lib/format';

const STATUS_TONE: Record<TrialStatus, BadgeTone> = {
  draft: 'straw',
  'in-field': 'field',
  'harvest-in': 'field',
  closed: 'neutral',
};
/** What needs attention first: a harvest to close, then trials in the field, then drafts. */
const STATUS_ORDER: Record<TrialStatus, number> = {
  'harvest-in': 0,
  'in-field': 1,
  draft: 2,
  closed: 3,
};

/** Current trials first (what needs attention on top), closed ones apart below. */
export function TrialCardList({ trials }: { trials: readonly TrialSummary[] }) {
  const closed = trials.filter((t) => t.status === 'closed');
  if (trials.length === 0 || closed.length === 0) return <TrialCards trials={trials} />;
  return (
    <div className="space-y-8">
      <TrialCards trials={trials.filter((t) => t.status !== 'closed')} />
      <section aria-labelledby="closed-trials" className="space-y-3" data-testid="closed-trials">
        <h2 id="closed-trials" className="text-heading text-ink-muted">
          Closed trials (read-only)
        </h2>
        <TrialCards trials={closed} />
      </section>
    </div>
  );
}

function TrialCards({ trials }: { trials: readonly TrialSummary[] }) {
  if (trials.length === 0) {
    return (
      <EmptyState
        title="No trials yet"
        action={<ButtonLink to="/trials/new">Design a trial</ButtonLink>}
      >
        Start with the crop and its usual seeding rate; Sheaf sets up quarter, half, full and double
        rate strips for you to adjust.
      </EmptyState>
    );
  }
  const sorted = [...trials].sort(
    (a, b) =>
      STATUS_ORDER[a.status] - STATUS_ORDER[b.status] ||
      (b.season ?? '').localeCompare(a.season ?? '') ||
      a.name.localeCompare(b.name),
  );
  const networks = new Set(trials.map((t) => t.networkId));
  return (
    <ul className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
      {sorted.map((trial) => (
        <li key={trial.id}>
          <LinkCard to={`/trials/${trial.id}`} className="flex h-full flex-col gap-3">
            <div className="flex items-start justify-between gap-3">
              <h2 className="text-heading text-ink group-hover:text-accent">{trial.name}</h2>
              <Badge tone={STATUS_TONE[trial.status]} className="shrink-0">
                {trialStatusName(trial.status)}
              </Badge>
            </div>
            <dl className="mt-auto grid grid-cols-3 gap-2 border-t border-line pt-3 text-label">
              <div>
                <dt className="text-caption text-ink-muted">Crop</dt>
                <dd className="font-medium text-ink">{cropName(trial.crop)}</dd>
              </div>
              <div>
                <dt className="text-caption text-ink-muted">Season</dt>
                <dd className="font-medium text-ink">{trial.season ?? '—'}</dd>
              </div>
              <div>
                <dt className="text-caption text-ink-muted">Sites</dt>
                <dd className="figures font-medium text-ink">{trial.siteCount}</dd>
              </div>
            </dl>
            {networks.size > 1 ? (
              <p className="text-caption text-ink-muted">{trial.networkName}</p>
            ) : null}
          </LinkCard>
        </li>
      ))}
      <li className="sr-only">{plural(trials.length, 'trial')} in all</li>
    </ul>
  );
}
