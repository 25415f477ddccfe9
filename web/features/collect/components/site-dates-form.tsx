// Dates that apply to every strip of the site (sowing, emergence, heading, harvest): read as text,
// changed in a form opened on demand. A phone builds a date box slowly (its calendar and local
// date format): the first one took about 50 ms at a slow phone's speed, longer than anything else
// the site page builds, so the boxes exist only while someone is changing the dates.
import { useEffect, useRef, useState, type FormEvent } from 'react';
import type { SiteContext, SiteDates } from '../../../../shared/schemas/strip';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { apiFieldErrors, errorSummary } from '../../../lib/form-errors';
import { formatDate } from '../../../lib/format';
import { useUpdateSiteData } from '../api/update-site-data';

const DATE_FIELDS: { key: keyof SiteDates; label: string }[] = [
  { key: 'sowingDate', label: 'Sowing' },
  { key: 'emergenceDate', label: 'Emergence' },
  { key: 'headingDate', label: 'Heading' },
  { key: 'harvestDate', label: 'Harvest' },
];

const datesOf = (site: SiteContext): SiteDates => ({
  sowingDate: site.sowingDate,
  emergenceDate: site.emergenceDate,
  headingDate: site.headingDate,
  harvestDate: site.harvestDate,
});

export function SiteDatesForm({ site }: { site: SiteContext }) {
  const [editing, setEditing] = useState(false);
  const firstBox = useRef<HTMLInputElement>(null);
  // Opened for changing: the first date box takes the focus, for a keyboard or a screen reader.
  useEffect(() => {
    if (editing) firstBox.current?.focus();
  }, [editing]);
  const [dates, setDates] = useState<SiteDates>(() => datesOf(site));
  const update = useUpdateSiteData(site.siteId);
  const fields = apiFieldErrors(update.error);
  const changed = DATE_FIELDS.some(({ key }) => dates[key] !== site[key]);
  const submit = (event: FormEvent) => {
    event.preventDefault();
    update.mutate(dates, { onSuccess: () => setEditing(false) });
  };
  const cancel = () => {
    setDates(datesOf(site));
    update.reset();
    setEditing(false);
  };
  return (
    <form onSubmit={submit} className="space-y-3" aria-labelledby="site-dates-title">
      <h2 id="site-dates-title" className="text-heading text-ink">
        Site dates
      </h2>
      <p className="text-label text-ink-muted">
        These apply to every strip. Give a date on a strip only when it differs.
      </p>
      {editing ? (
        <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-1">
          {DATE_FIELDS.map(({ key, label }, index) => (
            <TextField
              key={key}
              ref={index === 0 ? firstBox : undefined}
              type="date"
              label={label}
              value={dates[key] ?? ''}
              error={fields[key]}
              onChange={(event) => setDates((d) => ({ ...d, [key]: event.target.value || null }))}
            />
          ))}
        </div>
      ) : (
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1.5 text-body">
          {DATE_FIELDS.map(({ key, label }) => (
            <div key={key} className="contents">
              <dt className="text-ink-muted">{label}</dt>
              <dd className="text-ink">
                {site[key] ? (
                  <time dateTime={site[key]}>{formatDate(site[key])}</time>
                ) : (
                  <span className="text-ink-muted">not yet</span>
                )}
              </dd>
            </div>
          ))}
        </dl>
      )}
      {update.isError ? <Alert tone="danger">{errorSummary(update.error)}</Alert> : null}
      {!site.canEdit ? null : editing ? (
        <div className="flex flex-wrap gap-2">
          <Button type="submit" variant="secondary" busy={update.isPending} disabled={!changed}>
            Save dates
          </Button>
          <Button type="button" variant="quiet" onClick={cancel}>
            Cancel
          </Button>
        </div>
      ) : (
        <Button type="button" variant="secondary" onClick={() => setEditing(true)}>
          Change dates
        </Button>
      )}
    </form>
  );
}
