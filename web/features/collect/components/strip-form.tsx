// The per-strip form for a phone: large inputs with numeric keyboards, units from the trial,
// derived values and warnings as you type; every change is kept on the device and sent.
import type { ReactNode } from 'react';
import type { SiteStrips, StripDto, StripValuesPatch } from '../../../../shared/schemas/strip';
import { SUBSAMPLES } from '../../../../shared/import/columns';
import { entryUnits } from '../../../../shared/units/strip-derived';
import { Alert } from '../../../components/ui/alert';
import { ButtonLink } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { queueEdit, useStripOutbox } from '../lib/outbox';
import { effectiveValues, formatNumber, liveDerived } from '../lib/strip-values';
import { ConflictPanel } from './conflict-panel';
import { ValueInput } from './number-input';
import { StripPhotos } from './photo-panel';

function Section({
  title,
  children,
  readout,
}: {
  title: string;
  children: ReactNode;
  readout?: ReactNode;
}) {
  return (
    <Card className="space-y-4 p-4 sm:p-5">
      <h2 className="text-heading text-ink">{title}</h2>
      {children}
      {readout ? (
        <div className="rounded-field bg-accent-soft px-3 py-2.5 text-accent">{readout}</div>
      ) : null}
    </Card>
  );
}

function Readout({ items }: { items: { label: string; value: string; testId?: string }[] }) {
  return (
    <dl className="grid grid-cols-2 gap-x-4 gap-y-1">
      {items.map((item) => (
        <div key={item.label}>
          <dt className="text-caption">{item.label}</dt>
          <dd className="figures text-lead font-bold" data-testid={item.testId}>
            {item.value}
          </dd>
        </div>
      ))}
    </dl>
  );
}

export function StripForm({ data, strip }: { data: SiteStrips; strip: StripDto }) {
  const { site } = data;
  const entry = useStripOutbox(strip.stripId);
  const values = effectiveValues(strip, entry);
  const { derived, warnings } = liveDerived(site, strip, values);
  const units = entryUnits(site.unitSystem);
  const disabled = !site.canEdit;
  const onPatch = (patch: StripValuesPatch) => queueEdit(strip, patch);
  const common = { values, onPatch, disabled, strip, entry };
  const order = [...data.strips].sort((a, b) => a.block - b.block || a.position - b.position);
  const index = order.findIndex((s) => s.stripId === strip.stripId);
  const previous = order[index - 1];
  const next = order[index + 1];
  const metric = site.unitSystem === 'metric';

  return (
    <div className="mx-auto max-w-xl space-y-4">
      {entry ? <ConflictPanel entry={entry} /> : null}
      {warnings.length > 0 ? (
        <Alert tone="caution" title="Check these numbers">
          <ul className="list-disc space-y-1 pl-4" data-testid="strip-warnings">
            {warnings.map((w) => (
              <li key={w}>{w}</li>
            ))}
          </ul>
          <p className="mt-1 text-caption">
            Warnings never stop saving: fix the number if it was a slip, or leave a note.
          </p>
        </Alert>
      ) : null}

      <Section
        title="Stand count"
        readout={
          <Readout
            items={[
              metric
                ? {
                    label: 'Plants per m²',
                    value: formatNumber(derived.plantsPerSquareMetre),
                    testId: 'plants-per-area',
                  }
                : {
                    label: 'Plants per ft²',
                    value: formatNumber(derived.plantsPerSquareFoot),
                    testId: 'plants-per-area',
                  },
              {
                label: 'Establishment',
                value:
                  derived.establishmentPercent === null
                    ? '—'
                    : `${formatNumber(derived.establishmentPercent, 0)} %`,
              },
            ]}
          />
        }
      >
        <p className="text-label text-ink-muted">
          Plants on each measured length of row; up to {SUBSAMPLES} places in the strip, avoiding
          the best and worst spots.
        </p>
        <div className="grid grid-cols-3 gap-3">
          {Array.from({ length: SUBSAMPLES }, (_, i) => (
            <ValueInput
              key={i}
              label={`Count ${i + 1}`}
              field="standCounts"
              index={i}
              kind="int"
              {...common}
            />
          ))}
        </div>
        <ValueInput
          label="Row length of each count"
          field="standRowLength"
          kind="number"
          suffix={units.length}
          {...common}
        />
      </Section>

      <Section
        title="Tillers"
        readout={
          <Readout
            items={[
              { label: 'Tillers per plant', value: formatNumber(derived.tillersPerPlant, 2) },
            ]}
          />
        }
      >
        <div className="grid grid-cols-2 gap-3">
          <ValueInput label="Plants examined" field="tillerPlants" kind="int" {...common} />
          <ValueInput label="Tillers counted" field="tillerCount" kind="int" {...common} />
        </div>
      </Section>

      <Section
        title="Heads"
        readout={
          <Readout
            items={[
              metric
                ? { label: 'Heads per m²', value: formatNumber(derived.headsPerSquareMetre) }
                : { label: 'Heads per ft²', value: formatNumber(derived.headsPerSquareFoot) },
              { label: 'Heads per plant', value: formatNumber(derived.headsPerPlant, 2) },
            ]}
          />
        }
      >
        <div className="grid grid-cols-3 gap-3">
          {Array.from({ length: SUBSAMPLES }, (_, i) => (
            <ValueInput
              key={i}
              label={`Count ${i + 1}`}
              field="headCounts"
              index={i}
              kind="int"
              {...common}
            />
          ))}
        </div>
        <ValueInput
          label="Row length of each count"
          field="headRowLength"
          kind="number"
          suffix={units.length}
          {...common}
        />
      </Section>

      <Section
        title="Threshed grain"
        readout={
          <Readout
            items={
              metric
                ? [
                    {
                      label: 'Yield, t/ha',
                      value: formatNumber(
                        derived.yieldKilogramsPerHectare === null
                          ? null
                          : derived.yieldKilogramsPerHectare / 1000,
                        2,
                      ),
                      testId: 'yield-t',
                    },
                    {
                      label: 'Yield, kg/ha',
                      value: formatNumber(derived.yieldKilogramsPerHectare, 0),
                      testId: 'yield-kg',
                    },
                  ]
                : [
                    {
                      label: 'Yield, bu/acre',
                      value: formatNumber(derived.yieldBushelsPerAcre),
                      testId: 'yield-bu',
                    },
                    {
                      label: 'Yield, kg/ha',
                      value: formatNumber(derived.yieldKilogramsPerHectare, 0),
                      testId: 'yield-kg',
                    },
                  ]
            }
          />
        }
      >
        <ValueInput
          label="Grain weight"
          field="grainWeight"
          kind="number"
          suffix={units.weight}
          {...common}
        />
        <div className="grid grid-cols-2 gap-3">
          <ValueInput
            label="Rows harvested"
            field="harvestRows"
            kind="int"
            hint={site.rowsPerStrip ? `Strip has ${site.rowsPerStrip}` : undefined}
            {...common}
          />
          <ValueInput
            label="Length harvested"
            field="harvestLength"
            kind="number"
            suffix={units.length}
            {...common}
          />
        </div>
        <ValueInput
          label="Or harvested area"
          field="harvestArea"
          kind="number"
          suffix={units.area}
          hint="Only when it is not rows × length"
          {...common}
        />
        <div className="grid grid-cols-2 gap-3">
          <ValueInput label="Moisture" field="moisturePct" kind="number" suffix="%" {...common} />
          <ValueInput
            label="Test weight"
            field="testWeight"
            kind="number"
            suffix={units.testWeight}
            hint="Optional"
            {...common}
          />
        </div>
        <p className="text-caption text-ink-muted">
          Yield is at the crop’s standard moisture, {site.standardMoisturePercent ?? '—'} %
          {site.bushelPounds && !metric ? `, and ${site.bushelPounds} lb per bushel` : ''}.
        </p>
      </Section>

      <Section title="Dates for this strip">
        <p className="text-label text-ink-muted">Leave empty when the site dates apply.</p>
        <div className="grid gap-3 sm:grid-cols-2">
          <ValueInput label="Sowing" field="sowingDate" kind="date" {...common} />
          <ValueInput label="Emergence" field="emergenceDate" kind="date" {...common} />
          <ValueInput label="Heading" field="headingDate" kind="date" {...common} />
          <ValueInput label="Harvest" field="harvestDate" kind="date" {...common} />
        </div>
      </Section>

      <Section title="Notes">
        <label htmlFor="strip-notes" className="sr-only">
          Notes
        </label>
        <textarea
          id="strip-notes"
          className="block min-h-28 w-full rounded-field border border-line-strong bg-surface px-3 py-2 text-body text-ink focus:border-accent focus:outline-none focus:ring-2 focus:ring-accent/30"
          value={values.notes}
          disabled={disabled}
          maxLength={4000}
          onChange={(event) => onPatch({ notes: event.target.value })}
        />
        {strip.values.notes ? (
          <p className="text-caption text-ink-muted">
            Saved note: <span data-testid="saved-notes">{strip.values.notes}</span>
          </p>
        ) : null}
      </Section>

      <StripPhotos siteId={site.siteId} stripId={strip.stripId} canUpload={site.canEdit} />

      <nav aria-label="Other strips" className="flex justify-between gap-2 pt-2">
        {previous ? (
          <ButtonLink variant="secondary" to={`/sites/${site.siteId}/strips/${previous.stripId}`}>
            ← Plot {previous.plotNumber}
          </ButtonLink>
        ) : (
          <span />
        )}
        {next ? (
          <ButtonLink variant="secondary" to={`/sites/${site.siteId}/strips/${next.stripId}`}>
            Plot {next.plotNumber} →
          </ButtonLink>
        ) : (
          <ButtonLink variant="secondary" to={`/sites/${site.siteId}`}>
            All strips
          </ButtonLink>
        )}
      </nav>
    </div>
  );
}
