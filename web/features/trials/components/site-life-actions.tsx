// Per-site actions for a coordinator after design: hand the site to another grower, or mark it
// lost (hail, flood…) so the trial can count its harvest as in.
import { useState } from 'react';
import type { NetworkPerson, TrialSiteRow } from '../../../../shared/schemas/trial';
import { Button } from '../../../components/ui/button';
import { errorSummary } from '../../../lib/form-errors';
import { useChangeSite } from '../api/trial-life';

export function SiteLifeActions({
  trialId,
  site,
  people,
}: {
  trialId: string;
  site: TrialSiteRow;
  people: readonly NetworkPerson[];
}) {
  const change = useChangeSite(trialId);
  const [open, setOpen] = useState(false);
  const growers = people.filter((p) => p.role !== 'member' && p.userId !== site.growerUserId);
  return (
    <div className="mt-3 space-y-2 border-t border-line pt-3" data-testid="site-life-actions">
      {site.lostReason ? (
        <p className="text-label text-ink">
          Lost: {site.lostReason}{' '}
          <button
            type="button"
            className="text-accent underline"
            onClick={() => change.mutate({ siteId: site.id, change: { lostReason: null } })}
          >
            undo
          </button>
        </p>
      ) : null}
      {site.packetReissuedAt ? (
        <p className="text-caption text-ink-muted">Packet re-issued after a design amendment.</p>
      ) : null}
      {!site.growerUserId ? (
        <p className="text-caption text-ink-muted">No grower: hand the site on.</p>
      ) : null}
      {open ? (
        <div className="flex flex-wrap items-end gap-2">
          <label className="text-label text-ink">
            Hand to
            <select
              className="ml-2 min-h-11 rounded-field border border-line bg-surface px-2"
              defaultValue=""
              onChange={(e) =>
                e.target.value &&
                change.mutate(
                  { siteId: site.id, change: { growerUserId: e.target.value } },
                  { onSuccess: () => setOpen(false) },
                )
              }
            >
              <option value="" disabled>
                choose a grower
              </option>
              {growers.map((p) => (
                <option key={p.userId} value={p.userId}>
                  {p.name}
                </option>
              ))}
            </select>
          </label>
          <Button variant="quiet" onClick={() => setOpen(false)}>
            Cancel
          </Button>
        </div>
      ) : (
        <div className="flex flex-wrap gap-2">
          <Button variant="quiet" onClick={() => setOpen(true)}>
            Hand over
          </Button>
          {!site.lostReason && !site.hasYield ? (
            <Button
              variant="quiet"
              onClick={() => {
                const reason = window.prompt('What happened to this site (hail, flood, grazed…)?');
                if (reason && reason.trim().length >= 3)
                  change.mutate({ siteId: site.id, change: { lostReason: reason.trim() } });
              }}
            >
              Mark lost
            </Button>
          ) : null}
        </div>
      )}
      {change.error ? (
        <p className="text-caption text-danger">{errorSummary(change.error)}</p>
      ) : null}
    </div>
  );
}
