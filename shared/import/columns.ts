// The columns of a site's strip CSV: header names (units follow the trial), which strip value
// each fills, and how a cell is read. The template, the importer and the grid all use this.
import type { ObservationValues } from '../schemas/observation';
import type { UnitSystem } from '../schemas/trial';

export type CellKind = 'int' | 'number' | 'date' | 'text';
type UnitKey = 'length' | 'weight' | 'area' | 'testWeight';

/** Fields of ObservationValues that hold one value (not a list of subsamples). */
export type ScalarField = Exclude<keyof ObservationValues, 'standCounts' | 'headCounts'>;
export type ListField = 'standCounts' | 'headCounts';

export interface ValueColumn {
  /** Header in the CSV, e.g. `grain_weight_lb`. */
  header: string;
  field: ScalarField | ListField;
  /** For subsample lists: which subsample (0-based). */
  index?: number;
  kind: CellKind;
  /** Plain-language meaning, with the unit. */
  meaning: string;
}

export const IDENTITY_HEADERS = ['site', 'plot', 'block', 'position', 'rate'] as const;
export const SUBSAMPLES = 6;

const UNIT_SUFFIX: Record<UnitSystem, Record<UnitKey, string>> = {
  imperial: { length: 'ft', weight: 'lb', area: 'ft2', testWeight: 'lb_bu' },
  metric: { length: 'm', weight: 'kg', area: 'm2', testWeight: 'kg_hl' },
};
const UNIT_WORDS: Record<UnitSystem, Record<UnitKey, string>> = {
  imperial: { length: 'feet', weight: 'pounds', area: 'square feet', testWeight: 'lb per bushel' },
  metric: {
    length: 'metres',
    weight: 'kilograms',
    area: 'square metres',
    testWeight: 'kg per hectolitre',
  },
};

interface ColumnSpec {
  base: string;
  field: ScalarField | ListField;
  kind: CellKind;
  unit?: UnitKey;
  list?: boolean;
  meaning: (unit: string) => string;
}

const SPECS: ColumnSpec[] = [
  {
    base: 'seeds_sown',
    field: 'seedsSown',
    kind: 'int',
    meaning: () => 'Seeds sown on the strip (count)',
  },
  {
    base: 'stand',
    field: 'standCounts',
    kind: 'int',
    list: true,
    meaning: () => 'Plants counted on one measured row length (subsample)',
  },
  {
    base: 'stand_row_length',
    field: 'standRowLength',
    kind: 'number',
    unit: 'length',
    meaning: (u) => `Row length of each stand-count subsample, in ${u}`,
  },
  {
    base: 'tiller_plants',
    field: 'tillerPlants',
    kind: 'int',
    meaning: () => 'Plants dug or examined for tillers (count)',
  },
  {
    base: 'tillers',
    field: 'tillerCount',
    kind: 'int',
    meaning: () => 'Tillers counted on those plants (count)',
  },
  {
    base: 'heads',
    field: 'headCounts',
    kind: 'int',
    list: true,
    meaning: () => 'Heads counted on one measured row length (subsample)',
  },
  {
    base: 'head_row_length',
    field: 'headRowLength',
    kind: 'number',
    unit: 'length',
    meaning: (u) => `Row length of each head-count subsample, in ${u}`,
  },
  {
    base: 'grain_weight',
    field: 'grainWeight',
    kind: 'number',
    unit: 'weight',
    meaning: (u) => `Threshed grain weight from the harvested area, in ${u}`,
  },
  {
    base: 'harvest_rows',
    field: 'harvestRows',
    kind: 'int',
    meaning: () => 'Rows harvested (count)',
  },
  {
    base: 'harvest_length',
    field: 'harvestLength',
    kind: 'number',
    unit: 'length',
    meaning: (u) => `Length harvested, in ${u}`,
  },
  {
    base: 'harvest_area',
    field: 'harvestArea',
    kind: 'number',
    unit: 'area',
    meaning: (u) => `Harvested area when it is not rows × length, in ${u}`,
  },
  {
    base: 'moisture_pct',
    field: 'moisturePct',
    kind: 'number',
    meaning: () => 'Grain moisture at weighing, %',
  },
  {
    base: 'test_weight',
    field: 'testWeight',
    kind: 'number',
    unit: 'testWeight',
    meaning: (u) => `Test weight (optional), ${u}`,
  },
  {
    base: 'sowing_date',
    field: 'sowingDate',
    kind: 'date',
    meaning: () => 'Sowing date of this strip, YYYY-MM-DD (leave empty when the site date applies)',
  },
  {
    base: 'emergence_date',
    field: 'emergenceDate',
    kind: 'date',
    meaning: () => 'Emergence date, YYYY-MM-DD',
  },
  {
    base: 'heading_date',
    field: 'headingDate',
    kind: 'date',
    meaning: () => 'Heading date, YYYY-MM-DD',
  },
  {
    base: 'harvest_date',
    field: 'harvestDate',
    kind: 'date',
    meaning: () => 'Harvest date, YYYY-MM-DD',
  },
  { base: 'notes', field: 'notes', kind: 'text', meaning: () => 'Notes (plain text)' },
];

function headerFor(spec: ColumnSpec, system: UnitSystem): string {
  return spec.unit ? `${spec.base}_${UNIT_SUFFIX[system][spec.unit]}` : spec.base;
}

/** The value columns of the template for a trial's unit system, in template order. */
export function valueColumns(system: UnitSystem): ValueColumn[] {
  const columns: ValueColumn[] = [];
  for (const spec of SPECS) {
    const unitWord = spec.unit ? UNIT_WORDS[system][spec.unit] : '';
    if (spec.list) {
      for (let i = 0; i < SUBSAMPLES; i += 1) {
        columns.push({
          header: `${spec.base}_${i + 1}`,
          field: spec.field,
          index: i,
          kind: spec.kind,
          meaning: `${spec.meaning(unitWord)} ${i + 1}`,
        });
      }
    } else {
      columns.push({
        header: headerFor(spec, system),
        field: spec.field,
        kind: spec.kind,
        meaning: spec.meaning(unitWord),
      });
    }
  }
  return columns;
}

/** Every header of the template, identity columns first. */
export function templateHeaders(system: UnitSystem): string[] {
  return [...IDENTITY_HEADERS, ...valueColumns(system).map((c) => c.header)];
}

/** Header documentation for the import page. */
export function columnDocs(system: UnitSystem): { header: string; meaning: string }[] {
  return [
    { header: 'site', meaning: 'The field name of the site (filled in; must match)' },
    {
      header: 'plot',
      meaning:
        'Plot number, block × 100 + position, as on the map and stakes (filled in; identifies the strip)',
    },
    { header: 'block', meaning: 'Block number (filled in; identifies the strip)' },
    {
      header: 'position',
      meaning: 'Position of the strip in its block (filled in; identifies the strip)',
    },
    { header: 'rate', meaning: 'Rate level of the strip (filled in; must match the map)' },
    ...valueColumns(system).map(({ header, meaning }) => ({ header, meaning })),
  ];
}

/** If a header belongs to the other unit system, the header this trial expects instead. */
export function otherSystemHeader(header: string, system: UnitSystem): string | null {
  const other: UnitSystem = system === 'metric' ? 'imperial' : 'metric';
  for (const spec of SPECS) {
    if (spec.unit && headerFor(spec, other) === header) return headerFor(spec, system);
  }
  return null;
}
