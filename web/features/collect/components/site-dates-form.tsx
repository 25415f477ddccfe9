// Dates that apply to every strip of the site (sowing, emergence, heading, harvest).
import { useState, type FormEvent } from 'react';
import type { SiteContext, SiteDates } from '../../../../shared/schemas/strip';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/text-field';
import { apiFieldErrors, errorSummary } from '../../../lib/form-errors';
import { useUpdateSiteData } from '../api/update-site-data';

const DATE_FIELDS: { key: keyof SiteDates; label: string }[] = [
  { key: 'sowingDate', label: 'Sowing' },
  { key: 'emergenceDate', label: 'Emergence' },
  { key: 'headingDate', label: 'Heading' },
  { key: 'harvestDate', label: 'Harvest' },
];

export function SiteDatesForm({ site }: { site: SiteContext }) {
  const [dates, setDates] = useState<SiteDates>({
    sowingDate: site.sowingDate,
    emergenceDate: site.emergenceDate,
    headingDate: site.headingDate,
    harvestDate: site.harvestDate,
  });
  const update = useUpdateSiteData(site.siteId);
  const fields = apiFieldErrors(update.error);
  const changed = DATE_FIELDS.some(({ key }) => dates[key] !== site[key]);
  const submit = (event: FormEvent) => {
    event.preventDefault();
    update.mutate(dates);
  };
  return (
    <form onSubmit={submit} className="space-y-3" aria-labelledby="site-dates-title">
      <h2 id="site-dates-title" className="text-heading text-ink">
        Site dates
      </h2>
      <p className="text-label text-ink-muted">
        These apply to every strip. Give a date on a strip only when it differs.
      </p>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-1">
        {DATE_FIELDS.map(({ key, label }) => (
          <TextField
            key={key}
            type="date"
            label={label}
            value={dates[key] ?? ''}
            disabled={!site.canEdit}
            error={fields[key]}
            onChange={(event) => setDates((d) => ({ ...d, [key]: event.target.value || null }))}
          />
        ))}
      </div>
      {update.isError ? <Alert tone="danger">{errorSummary(update.error)}</Alert> : null}
      {site.canEdit ? (
        <Button type="submit" variant="secondary" busy={update.isPending} disabled={!changed}>
          {update.isSuccess && !changed ? 'Dates saved' : 'Save dates'}
        </Button>
      ) : null}
    </form>
  );
}
