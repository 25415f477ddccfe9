// The trial's sites with grower, randomization state and links to map, packet and data pages.
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { TrialSiteRow } from '../../../../shared/schemas/trial';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { errorSummary } from '../../../lib/form-errors';
import { formatDate } from '../../../lib/format';
import { useRandomizeSite, useSendPacket } from '../api/trial-mutations';

export function SitesTable({
  trialId,
  sites,
  canEdit,
  viewerId,
  active,
  extra,
}: {
  trialId: string;
  sites: TrialSiteRow[];
  canEdit: boolean;
  /** The signed-in user: a grower enters data only on their own sites. */
  viewerId?: string;
  active: boolean;
  /** More per-site controls (hand-over, lost) shown under each site's actions. */
  extra?: (site: TrialSiteRow) => ReactNode;
}) {
  const randomize = useRandomizeSite(trialId);
  const sendPacket = useSendPacket();
  if (sites.length === 0) {
    return (
      <EmptyState title="No sites yet">
        {canEdit
          ? 'Enrol each grower’s field below; then randomize its strips and send the field packet.'
          : 'No site of this trial is open to you.'}
      </EmptyState>
    );
  }

  function confirmRandomize(site: TrialSiteRow) {
    if (
      site.randomized &&
      !window.confirm(
        `Draw a new strip map for ${site.fieldName}? The current map and its packet will be replaced.`,
      )
    )
      return;
    randomize.mutate({ siteId: site.id });
  }

  return (
    <div className="space-y-3">
      {randomize.isError ? (
        <p role="alert" className="text-label text-danger">
          {errorSummary(randomize.error)}
        </p>
      ) : null}
      {sendPacket.isError ? (
        <p role="alert" className="text-label text-danger">
          {errorSummary(sendPacket.error)}
        </p>
      ) : null}
      {sendPacket.isSuccess ? (
        <p role="status" className="text-label text-accent">
          Packet e-mail sent to {sendPacket.data.sent[0]?.to}.
        </p>
      ) : null}
      <ul className="grid grid-cols-1 gap-3 md:grid-cols-2" aria-label="Sites">
        {sites.map((site) => (
          <li
            key={site.id}
            className="min-w-0 rounded-card border border-line bg-surface p-4 shadow-card"
            data-testid="site-row"
          >
            <div className="flex flex-wrap items-start justify-between gap-2">
              <div className="min-w-0">
                <h3 className="text-heading text-ink">{site.fieldName}</h3>
                <p className="truncate text-label font-normal text-ink-muted">
                  {site.growerName ?? site.growerEmail ?? 'No grower'}
                  {site.invitationPending ? ' · invitation sent' : ''}
                </p>
              </div>
              {site.publishedAt ? (
                <Badge tone="info">Report published</Badge>
              ) : site.sowingRecorded ? (
                <Badge tone="field">
                  Sown{site.sowingDate ? ` ${formatDate(site.sowingDate)}` : ''}
                </Badge>
              ) : site.randomized ? (
                <Badge tone="straw">Map ready</Badge>
              ) : (
                <Badge>Not randomized</Badge>
              )}
            </div>
            <div className="mt-3 flex flex-wrap gap-2">
              {canEdit && !site.sowingRecorded && !site.publishedAt ? (
                <Button
                  variant={site.randomized ? 'secondary' : 'primary'}
                  onClick={() => confirmRandomize(site)}
                  busy={randomize.isPending && randomize.variables?.siteId === site.id}
                  disabled={!active}
                  title={!active ? 'Send the trial to the field first' : undefined}
                >
                  {site.randomized ? 'Re-randomize' : 'Randomize'}
                </Button>
              ) : null}
              {site.randomized ? (
                <>
                  <Link
                    className="inline-flex min-h-11 items-center rounded-field px-3 text-label font-semibold text-accent hover:bg-accent-soft"
                    to={`/sites/${site.id}/map`}
                  >
                    Strip map
                  </Link>
                  <Link
                    className="inline-flex min-h-11 items-center rounded-field px-3 text-label font-semibold text-accent hover:bg-accent-soft"
                    to={`/sites/${site.id}/packet`}
                  >
                    Field packet
                  </Link>
                </>
              ) : null}
              {canEdit && site.randomized ? (
                <Button
                  variant="quiet"
                  onClick={() => sendPacket.mutate(site.id)}
                  busy={sendPacket.isPending && sendPacket.variables === site.id}
                >
                  E-mail packet
                </Button>
              ) : null}
              {canEdit || (viewerId !== undefined && site.growerUserId === viewerId) ? (
                <Link
                  className="inline-flex min-h-11 items-center rounded-field px-3 text-label font-semibold text-accent hover:bg-accent-soft"
                  to={`/sites/${site.id}`}
                >
                  Data entry
                </Link>
              ) : null}
              <Link
                className="inline-flex min-h-11 items-center rounded-field px-3 text-label font-semibold text-accent hover:bg-accent-soft"
                to={`/sites/${site.id}/report`}
              >
                Site report
              </Link>
            </div>
            {extra?.(site)}
          </li>
        ))}
      </ul>
    </div>
  );
}
