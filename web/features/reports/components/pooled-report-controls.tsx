// The pooled report's controls: the public link switch and the filters and prices a reader
// can change (which sites, seed and grain prices).
import { z } from 'zod';
import type { PooledQuery, PooledReport } from '../../../../shared/schemas/report';
import type { UnitConversion } from '../../../../shared/units/design-units';
import { reportDisplayUnits } from '../../../../shared/units/report-units';
import { Button } from '../../../components/ui/button';
import { FormNumberField } from '../../../components/ui/form-controls';
import { numberText } from '../../../lib/forms/number-text';
import { Form, useZodForm } from '../../../lib/forms/zod-form';
import { usePublicLink } from '../api/publish-report';

export interface FiltersProps {
  report: PooledReport;
  query: PooledQuery;
  onQuery: (query: PooledQuery) => void;
  isPublic?: boolean;
}

export function PublicLinkControl({ trialId, token }: { trialId: string; token: string | null }) {
  const link = usePublicLink(trialId);
  const url = token ? `${window.location.origin}/shared/${token}` : null;
  return (
    <div className="flex flex-col gap-2 rounded-card border border-line bg-surface p-4 sm:flex-row sm:items-center">
      <div className="min-w-0 flex-1">
        <p className="font-semibold text-ink">Public read-only link</p>
        {url ? (
          <p className="break-all text-label text-accent">
            <a href={url}>{url}</a>
          </p>
        ) : (
          <p className="text-label text-ink-muted">
            Off. Anyone with the link can read the published report without signing in; grower names
            are not shown.
          </p>
        )}
      </div>
      <Button
        variant={url ? 'secondary' : 'primary'}
        busy={link.isPending}
        onClick={() => link.mutate(!url)}
      >
        {url ? 'Turn the link off' : 'Turn the link on'}
      </Button>
    </div>
  );
}

const PricesSchema = z.object({
  seedPrice: numberText(z.number().min(0, 'At least 0').max(1000).optional()),
  grainPrice: numberText(z.number().positive('Must be above 0').max(10000).optional()),
});

/** A stored price in the unit the form shows, to four significant figures. */
const shownPrice = (stored: number | null, unit: UnitConversion) =>
  stored === null ? '' : String(Number(unit.fromStored(stored).toPrecision(4)));

/**
 * Prices are typed in the trial's units ($/kg and $/t on a metric trial) and sent to the API in
 * its own ($/lb of seed, $/bu of grain).
 */
function PricesForm({ report, query, onQuery }: Omit<FiltersProps, 'isPublic'>) {
  const display = reportDisplayUnits(report.trial.units, report.trial.crop);
  const form = useZodForm(PricesSchema, {
    defaultValues: {
      seedPrice: shownPrice(report.prices.seedPricePerLb, display.seedPrice),
      grainPrice: shownPrice(report.prices.grainPricePerBu, display.grainPrice),
    },
  });
  // A box left as shown (rounded) keeps the report's own price, so recalculating with other seed
  // prices does not nudge the grain price by its rounding.
  const stored = (value: number | undefined, unit: UnitConversion, current: number | null) =>
    value === undefined
      ? undefined
      : current !== null && String(value) === shownPrice(current, unit)
        ? current
        : unit.toStored(value);
  return (
    <Form
      form={form}
      onSubmit={(prices) =>
        onQuery({
          ...query,
          seedPrice: stored(prices.seedPrice, display.seedPrice, report.prices.seedPricePerLb),
          grainPrice: stored(prices.grainPrice, display.grainPrice, report.prices.grainPricePerBu),
        })
      }
      className="grid gap-3 sm:grid-cols-[1fr_1fr_auto] sm:items-start"
    >
      <div className="sm:col-span-3">
        <p className="text-label font-semibold text-ink">Try other prices</p>
        <p className="text-caption text-ink-muted">
          Return over seed cost is worked out again at the prices you enter.
        </p>
      </div>
      <FormNumberField name="seedPrice" label="Seed price" suffix={display.seedPrice.unit} />
      <FormNumberField name="grainPrice" label="Grain price" suffix={display.grainPrice.unit} />
      <Button type="submit" variant="secondary" className="sm:mt-7">
        Recalculate
      </Button>
    </Form>
  );
}

export function FiltersForm({ report, query, onQuery, isPublic }: FiltersProps) {
  const select = (name: 'soil' | 'previousCrop', label: string, options: string[]) => (
    <label className="flex flex-col gap-1.5 text-label text-ink">
      {label}
      <select
        value={query[name] ?? ''}
        onChange={(e) => onQuery({ ...query, [name]: e.target.value || undefined })}
        className="min-h-11 rounded-field border border-line-strong bg-surface px-3 text-body text-ink"
      >
        <option value="">All</option>
        {options.map((o) => (
          <option key={o} value={o}>
            {o}
          </option>
        ))}
      </select>
    </label>
  );
  return (
    <div className="no-print grid gap-4 rounded-card border border-line bg-sunken/60 p-4 lg:grid-cols-2">
      <fieldset className="grid gap-3 sm:grid-cols-2">
        <legend className="mb-2 text-label font-semibold text-ink">Which sites</legend>
        {select('soil', 'Soil', report.filterOptions.soil)}
        {select('previousCrop', 'Previous crop', report.filterOptions.previousCrop)}
        {!isPublic && report.canPublish ? (
          <label className="flex min-h-11 items-center gap-2 text-label text-ink sm:col-span-2">
            <input
              type="checkbox"
              className="size-5 accent-[var(--sheaf-accent)]"
              checked={query.sites === 'published'}
              onChange={(e) =>
                onQuery({ ...query, sites: e.target.checked ? 'published' : undefined })
              }
            />
            Only sites whose own report is published
          </label>
        ) : null}
      </fieldset>
      <PricesForm report={report} query={query} onQuery={onQuery} />
    </div>
  );
}
