// The strip form's sections, one component each: the inputs of one measurement in the trial's
// units, and what they work out to as you type.
import type { ReactNode } from 'react';
import type { DerivedValues } from '../../../../shared/schemas/observation';
import type { SiteContext, StripDto } from '../../../../shared/schemas/strip';
import { SUBSAMPLES } from '../../../../shared/import/columns';
import { KILOGRAMS_PER_TONNE } from '../../../../shared/units/constants';
import { entryUnits } from '../../../../shared/units/strip-derived';
import { Card } from '../../../components/ui/card';
import { formatNumber } from '../lib/strip-values';
import { ValueInput, type ValueInputProps } from './number-input';

/** What every input of the form shares: the values, the strip, its waiting edit and the writer. */
export type CommonInputProps = Pick<
  ValueInputProps,
  'values' | 'onPatch' | 'disabled' | 'strip' | 'entry'
>;

export interface StripSectionProps {
  site: SiteContext;
  strip: StripDto;
  derived: DerivedValues;
  common: CommonInputProps;
}

export function Section({
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

interface ReadoutItem {
  label: string;
  value: string;
  testId?: string;
}

function Readout({ items }: { items: ReadoutItem[] }) {
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

/** Six subsample boxes of one count. */
function Subsamples({
  field,
  common,
}: {
  field: 'standCounts' | 'headCounts';
  common: CommonInputProps;
}) {
  return (
    <div className="grid grid-cols-3 gap-3">
      {Array.from({ length: SUBSAMPLES }, (_, i) => (
        <ValueInput
          key={i}
          label={`Count ${i + 1}`}
          field={field}
          index={i}
          kind="int"
          {...common}
        />
      ))}
    </div>
  );
}

export function StandSection({ site, derived, common }: StripSectionProps) {
  const metric = site.unitSystem === 'metric';
  const perArea: ReadoutItem = metric
    ? {
        label: 'Plants per m²',
        value: formatNumber(derived.plantsPerSquareMetre),
        testId: 'plants-per-area',
      }
    : {
        label: 'Plants per ft²',
        value: formatNumber(derived.plantsPerSquareFoot),
        testId: 'plants-per-area',
      };
  const establishment =
    derived.establishmentPercent === null
      ? '—'
      : `${formatNumber(derived.establishmentPercent, 0)} %`;
  return (
    <Section
      title="Stand count"
      readout={<Readout items={[perArea, { label: 'Establishment', value: establishment }]} />}
    >
      <p className="text-label text-ink-muted">
        Plants on each measured length of row; up to {SUBSAMPLES} places in the strip, avoiding the
        best and worst spots.
      </p>
      <Subsamples field="standCounts" common={common} />
      <ValueInput
        label="Row length of each count"
        field="standRowLength"
        kind="number"
        suffix={entryUnits(site.unitSystem).length}
        {...common}
      />
    </Section>
  );
}

export function TillerSection({ derived, common }: StripSectionProps) {
  return (
    <Section
      title="Tillers"
      readout={
        <Readout
          items={[{ label: 'Tillers per plant', value: formatNumber(derived.tillersPerPlant, 2) }]}
        />
      }
    >
      <div className="grid grid-cols-2 gap-3">
        <ValueInput label="Plants examined" field="tillerPlants" kind="int" {...common} />
        <ValueInput label="Tillers counted" field="tillerCount" kind="int" {...common} />
      </div>
    </Section>
  );
}

export function HeadSection({ site, derived, common }: StripSectionProps) {
  const perArea =
    site.unitSystem === 'metric'
      ? { label: 'Heads per m²', value: formatNumber(derived.headsPerSquareMetre) }
      : { label: 'Heads per ft²', value: formatNumber(derived.headsPerSquareFoot) };
  return (
    <Section
      title="Heads"
      readout={
        <Readout
          items={[
            perArea,
            { label: 'Heads per plant', value: formatNumber(derived.headsPerPlant, 2) },
          ]}
        />
      }
    >
      <Subsamples field="headCounts" common={common} />
      <ValueInput
        label="Row length of each count"
        field="headRowLength"
        kind="number"
        suffix={entryUnits(site.unitSystem).length}
        {...common}
      />
    </Section>
  );
}

function yieldReadout(metric: boolean, derived: DerivedValues): ReadoutItem[] {
  const kilograms = derived.yieldKilogramsPerHectare;
  // A metric grower reads yield in t/ha, as the reports give it; an imperial one gets kg/ha beside.
  if (metric)
    return [
      {
        label: 'Yield, t/ha',
        value: formatNumber(kilograms === null ? null : kilograms / KILOGRAMS_PER_TONNE, 2),
        testId: 'yield-t',
      },
    ];
  return [
    {
      label: 'Yield, bu/acre',
      value: formatNumber(derived.yieldBushelsPerAcre),
      testId: 'yield-bu',
    },
    { label: 'Yield, kg/ha', value: formatNumber(kilograms, 0), testId: 'yield-kg' },
  ];
}

export function GrainSection({ site, derived, common }: StripSectionProps) {
  const metric = site.unitSystem === 'metric';
  const units = entryUnits(site.unitSystem);
  return (
    <Section title="Threshed grain" readout={<Readout items={yieldReadout(metric, derived)} />}>
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
  );
}

export function DatesSection({ common }: StripSectionProps) {
  return (
    <Section title="Dates for this strip">
      <p className="text-label text-ink-muted">Leave empty when the site dates apply.</p>
      <div className="grid gap-3 sm:grid-cols-2">
        <ValueInput label="Sowing" field="sowingDate" kind="date" {...common} />
        <ValueInput label="Emergence" field="emergenceDate" kind="date" {...common} />
        <ValueInput label="Heading" field="headingDate" kind="date" {...common} />
        <ValueInput label="Harvest" field="harvestDate" kind="date" {...common} />
      </div>
    </Section>
  );
}

export function NotesSection({ strip, common }: StripSectionProps) {
  const saved = strip.values.notes;
  return (
    <Section title="Notes">
      <label htmlFor="strip-notes" className="sr-only">
        Notes
      </label>
      <textarea
        id="strip-notes"
        className="block min-h-28 w-full rounded-field border border-line-strong bg-surface px-3 py-2 text-body text-ink focus:border-accent focus:outline-none focus:ring-2 focus:ring-accent/30"
        value={common.values.notes}
        disabled={common.disabled}
        maxLength={4000}
        onChange={(event) => common.onPatch({ notes: event.target.value })}
      />
      {saved ? (
        <p className="text-caption text-ink-muted">
          Saved note: <span data-testid="saved-notes">{saved}</span>
        </p>
      ) : null}
    </Section>
  );
}
