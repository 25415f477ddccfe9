// The coordinator's view of a trial's collection: per site, how many strips have each
// measurement in, plus reminder e-mails to growers with counts missing.
import { useState } from 'react';
import { Link } from 'react-router-dom';
import {
  MEASUREMENT_GROUPS,
  MEASUREMENT_GROUP_NAMES,
  type MeasurementGroup,
  type TrialProgress,
} from '../../../../shared/schemas/strip';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { cn } from '../../../lib/cn';
import { errorSummary } from '../../../lib/form-errors';
import { formatDate, formatDateTime, plural } from '../../../lib/format';
import { useSendReminders } from '../api/trial-progress';

export function ProgressTable({ progress }: { progress: TrialProgress }) {
  const [groups, setGroups] = useState<MeasurementGroup[]>([...MEASUREMENT_GROUPS]);
  const remind = useSendReminders(progress.trialId);
  const missingSites = progress.sites.filter(
    (s) => groups.some((g) => s.recorded[g] < s.stripCount) && !s.publishedAt,
  ).length;
  return (
    <div className="space-y-5">
      {/* A scrolling box takes keyboard focus so it can be scrolled without a mouse. */}
      <div
        className="overflow-x-auto rounded-card border border-line bg-surface shadow-card"
        tabIndex={0}
        role="region"
        aria-label="Progress by site"
      >
        <table className="w-full text-left text-label" data-testid="progress-table">
          <thead className="bg-sunken text-caption text-ink-muted">
            <tr>
              <th scope="col" className="px-3 py-2">
                Site
              </th>
              {MEASUREMENT_GROUPS.map((g) => (
                <th key={g} scope="col" className="px-3 py-2 text-right">
                  {MEASUREMENT_GROUP_NAMES[g]}
                </th>
              ))}
              <th scope="col" className="px-3 py-2">
                Sown
              </th>
              <th scope="col" className="px-3 py-2">
                Last change
              </th>
            </tr>
          </thead>
          <tbody>
            {progress.sites.map((site) => (
              <tr key={site.siteId} className="border-t border-line">
                <th scope="row" className="px-3 py-2 font-normal">
                  <Link to={`/sites/${site.siteId}`} className="font-semibold">
                    {site.fieldName}
                  </Link>
                  <span className="block text-caption text-ink-muted">
                    {site.growerName ?? site.growerEmail ?? 'No grower yet'}
                  </span>
                </th>
                {MEASUREMENT_GROUPS.map((g) => {
                  const done = site.recorded[g];
                  const complete = site.stripCount > 0 && done === site.stripCount;
                  return (
                    <td key={g} className="px-3 py-2 text-right">
                      <span
                        className={cn(
                          'figures inline-block min-w-14 rounded-full px-2 py-0.5 text-caption font-semibold',
                          complete
                            ? 'bg-accent-soft text-accent'
                            : done > 0
                              ? 'bg-straw-100 text-straw-800'
                              : 'bg-sunken text-ink-muted',
                        )}
                      >
                        {done}/{site.stripCount}
                      </span>
                    </td>
                  );
                })}
                <td className="px-3 py-2 text-caption">
                  {formatDate(site.dates.sowingDate) || '—'}
                </td>
                <td className="px-3 py-2 text-caption text-ink-muted">
                  {site.publishedAt ? 'Report published' : formatDateTime(site.lastChangeAt) || '—'}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      <Card className="space-y-3">
        <h2 className="text-heading text-ink">Remind growers</h2>
        <p className="text-label text-ink-muted">
          Sends each grower with something missing an e-mail listing how many strips still need each
          measurement, with a link to their site.
        </p>
        <fieldset className="flex flex-wrap gap-3">
          <legend className="sr-only">Measurements to ask about</legend>
          {MEASUREMENT_GROUPS.map((g) => (
            <label key={g} className="flex min-h-11 items-center gap-2 text-label">
              <input
                type="checkbox"
                className="size-5 accent-[var(--sheaf-accent)]"
                checked={groups.includes(g)}
                onChange={(event) =>
                  setGroups((current) =>
                    event.target.checked ? [...current, g] : current.filter((x) => x !== g),
                  )
                }
              />
              {MEASUREMENT_GROUP_NAMES[g]}
            </label>
          ))}
        </fieldset>
        {remind.isSuccess ? (
          <Alert tone="success" title={`${plural(remind.data.sent.length, 'reminder')} sent`}>
            {remind.data.sent.map((s) => s.to).join(', ') || 'Nobody needed one.'}
          </Alert>
        ) : null}
        {remind.isError ? <Alert tone="danger">{errorSummary(remind.error)}</Alert> : null}
        <Button
          onClick={() => remind.mutate({ groups })}
          busy={remind.isPending}
          disabled={groups.length === 0 || missingSites === 0}
        >
          E-mail {plural(missingSites, 'grower')} with missing counts
        </Button>
      </Card>
    </div>
  );
}
