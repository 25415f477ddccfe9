// The grower's home: each site they sow, with how many strips already have a yield.
import type { SiteSummary } from '../../../../shared/schemas/site';
import { Badge } from '../../../components/ui/badge';
import { LinkCard } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { cropName } from '../../../lib/format';

function Progress({ done, total }: { done: number; total: number }) {
  const percent = total > 0 ? Math.round((done / total) * 100) : 0;
  return (
    <div>
      <p className="figures text-label text-ink">
        <span className="font-semibold">{done}</span> of {total} strips with yield
      </p>
      <div
        role="progressbar"
        aria-label="Strips with yield"
        aria-valuemin={0}
        aria-valuemax={total}
        aria-valuenow={done}
        className="mt-1.5 h-2 overflow-hidden rounded-full bg-sunken ring-1 ring-inset ring-line"
      >
        <div className="h-full rounded-full bg-straw-500" style={{ width: `${percent}%` }} />
      </div>
    </div>
  );
}

export function SiteCardList({ sites }: { sites: readonly SiteSummary[] }) {
  if (sites.length === 0) {
    return (
      <EmptyState title="No sites yet">
        When your coordinator enrols one of your fields in a trial, it shows up here with its strip
        map and seed weights.
      </EmptyState>
    );
  }
  return (
    <ul className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
      {sites.map((site) => (
        <li key={site.id}>
          <LinkCard to={`/sites/${site.id}`} className="flex h-full flex-col gap-3">
            <div className="flex items-start justify-between gap-3">
              <div>
                <h2 className="text-heading text-ink group-hover:text-accent">{site.fieldName}</h2>
                <p className="text-label text-ink-muted">
                  {site.trialName}
                  {site.season ? ` · ${site.season}` : ''}
                </p>
              </div>
              {site.publishedAt ? (
                <Badge tone="field">Report out</Badge>
              ) : !site.randomized ? (
                <Badge tone="straw">Map coming</Badge>
              ) : null}
            </div>
            <p className="text-label text-ink-muted">{cropName(site.crop)}</p>
            <div className="mt-auto border-t border-line pt-3">
              <Progress done={site.stripsWithYield} total={site.stripCount} />
            </div>
          </LinkCard>
        </li>
      ))}
    </ul>
  );
}
