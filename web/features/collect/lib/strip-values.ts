// Helpers shared by the strip form and the grid: effective values (server + waiting edits),
// reading and writing one cell as text, and live derived values and warnings.
import {
  ObservationValuesSchema,
  type ObservationValues,
} from '../../../../shared/schemas/observation';
import type { SiteContext, StripDto, StripValuesPatch } from '../../../../shared/schemas/strip';
import type { ValueColumn } from '../../../../shared/import/columns';
import { groupedDecimal } from '../../../../shared/labels/decimal-text';
import { parseDecimal } from '../../../../shared/units/parse-decimal';
import {
  cropFacts,
  deriveStripValues,
  plausibilityWarnings,
  type CropFacts,
  type StripContext,
} from '../../../../shared/units/strip-derived';
import type { OutboxEntry } from './outbox';

export function effectiveValues(
  strip: StripDto,
  entry: OutboxEntry | undefined,
): ObservationValues {
  return entry ? { ...strip.values, ...entry.values } : strip.values;
}

export function siteCrop(site: SiteContext): CropFacts | null {
  if (site.crop && site.crop !== 'custom') return cropFacts(site.crop, null);
  if (site.bushelPounds && site.standardMoisturePercent !== null) {
    return {
      name: site.cropName ?? 'Crop',
      bushelPounds: site.bushelPounds,
      standardMoisturePercent: site.standardMoisturePercent,
      usualYieldBushelsPerAcre: null,
    };
  }
  return null;
}

export function stripContext(site: SiteContext, strip: StripDto): StripContext {
  return {
    unitSystem: site.unitSystem,
    crop: siteCrop(site),
    rowSpacingIn: site.rowSpacingIn,
    thousandKernelWeightG: site.thousandKernelWeightG,
    referenceRate: site.referenceRate,
    referenceUnit: site.referenceUnit as StripContext['referenceUnit'],
    multiplier: strip.rate,
    seedPricePerLb: site.seedPricePerLb,
    grainPricePerBu: site.grainPricePerBu,
  };
}

/** Derived values and warnings for what is on screen now; the site-wide outlier check comes from the server. */
export function liveDerived(site: SiteContext, strip: StripDto, values: ObservationValues) {
  const derived = deriveStripValues(values, stripContext(site, strip));
  const warnings = plausibilityWarnings(values, derived, siteCrop(site));
  for (const warning of strip.warnings)
    if (/stands out/.test(warning) && !warnings.includes(warning)) warnings.push(warning);
  return { derived, warnings };
}

/** The text a cell shows for a value. */
export function cellText(
  values: ObservationValues,
  column: Pick<ValueColumn, 'field' | 'index'>,
): string {
  const value = values[column.field];
  const item = Array.isArray(value) ? value[column.index ?? 0] : value;
  return item === null || item === undefined ? '' : String(item);
}

/**
 * The partial update for typing `text` into one cell, or the reason it cannot be saved.
 * An emptied cell clears the value (a subsample list closes up).
 */
export function patchForCell(
  values: ObservationValues,
  column: Pick<ValueColumn, 'field' | 'index' | 'kind'>,
  text: string,
): { patch: StripValuesPatch } | { error: string } {
  let value: unknown;
  if (column.kind === 'text') value = text;
  else if (text.trim() === '') value = null;
  else if (column.kind === 'date') value = text.trim();
  else {
    const read = parseDecimal(text);
    if (!read.ok) return { error: read.message };
    value = read.value;
  }
  if (column.index !== undefined) {
    const list = [...((values[column.field] as number[] | undefined) ?? [])];
    const cells: (number | null)[] = Array.from(
      { length: Math.max(list.length, column.index + 1) },
      (_, i) => list[i] ?? null,
    );
    cells[column.index] = value as number | null;
    const next = cells.filter((v): v is number => v !== null);
    const result = ObservationValuesSchema.shape[column.field as 'standCounts'].safeParse(next);
    if (!result.success) return { error: result.error.issues[0]?.message ?? 'Not valid' };
    return { patch: { [column.field]: next } };
  }
  const result = ObservationValuesSchema.shape[column.field].safeParse(value);
  if (!result.success) return { error: result.error.issues[0]?.message ?? 'Not valid' };
  return { patch: { [column.field]: result.data } };
}

export const FIELD_LABELS: Record<keyof ObservationValues, string> = {
  seedsSown: 'Seeds sown',
  standCounts: 'Stand counts',
  standRowLength: 'Stand row length',
  tillerPlants: 'Plants examined for tillers',
  tillerCount: 'Tillers counted',
  headCounts: 'Head counts',
  headRowLength: 'Head row length',
  grainWeight: 'Grain weight',
  harvestRows: 'Rows harvested',
  harvestLength: 'Length harvested',
  harvestArea: 'Harvested area',
  moisturePct: 'Moisture %',
  testWeight: 'Test weight',
  sowingDate: 'Sowing date',
  emergenceDate: 'Emergence date',
  headingDate: 'Heading date',
  harvestDate: 'Harvest date',
  notes: 'Notes',
};

export function formatNumber(value: number | null | undefined, digits = 1): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  // Without the locale data: the site page lists these first (shared/labels/decimal-text.ts).
  return groupedDecimal(value, digits);
}

export function rateText(strip: Pick<StripDto, 'label' | 'rate'>): string {
  return `${strip.label} (${strip.rate}×)`;
}
