// Turns audit events into sentences a grower reads without a manual: names instead of ids,
// plot numbers instead of strip ids, values with their units.
import type { UnitSystem } from '../../shared/schemas/trial';

export interface EventForWords {
  action: string;
  entityType: string;
  who: string;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
  /** Block and position when the event is about a strip. */
  strip: { block: number; position: number } | null;
}

interface FieldWords {
  name: string;
  unit?: (system: UnitSystem) => string;
}

const length = (s: UnitSystem) => (s === 'metric' ? 'm' : 'ft');
const FIELDS: Record<string, FieldWords> = {
  seedsSown: { name: 'seeds sown' },
  standCounts: { name: 'stand counts', unit: () => 'plants' },
  standRowLength: { name: 'row length of the stand counts', unit: length },
  tillerPlants: { name: 'plants checked for tillers' },
  tillerCount: { name: 'tillers counted' },
  headCounts: { name: 'head counts', unit: () => 'heads' },
  headRowLength: { name: 'row length of the head counts', unit: length },
  grainWeight: { name: 'threshed grain weight', unit: (s) => (s === 'metric' ? 'kg' : 'lb') },
  harvestRows: { name: 'rows harvested' },
  harvestLength: { name: 'length harvested', unit: length },
  harvestArea: { name: 'harvested area', unit: (s) => (s === 'metric' ? 'm²' : 'ft²') },
  moisturePct: { name: 'grain moisture', unit: () => '%' },
  testWeight: { name: 'test weight', unit: (s) => (s === 'metric' ? 'kg/hl' : 'lb/bu') },
  sowingDate: { name: 'sowing date' },
  emergenceDate: { name: 'emergence date' },
  headingDate: { name: 'heading date' },
  harvestDate: { name: 'harvest date' },
  notes: { name: 'notes' },
};

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** "2027-08-14" → "14 Aug 2027"; anything else unchanged. */
function plainDate(text: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  if (!m) return text;
  return `${Number(m[3])} ${MONTHS[Number(m[2]) - 1]} ${m[1]}`;
}

function plainValue(value: unknown, unit: string | undefined): string {
  if (value === null || value === undefined || value === '') return 'nothing';
  if (Array.isArray(value)) {
    if (value.length === 0) return 'nothing';
    return `${value.join(', ')}${unit ? ` ${unit}` : ''}`;
  }
  if (typeof value === 'string') {
    const date = plainDate(value);
    return date !== value ? date : `“${value.length > 60 ? `${value.slice(0, 57)}…` : value}”`;
  }
  if (typeof value === 'number') return `${value}${unit ? (unit === '%' ? ' %' : ` ${unit}`) : ''}`;
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  return 'a new value';
}

/** Plot number as on the field sheet: block × 100 + position (block 2, strip 3 → 203). */
export function plotNumber(strip: { block: number; position: number }): number {
  return strip.block * 100 + strip.position;
}

function changes(event: EventForWords, system: UnitSystem, where: string): string[] {
  const after = event.after ?? {};
  return Object.keys(after)
    .filter((key) => FIELDS[key])
    .map((key) => {
      const field = FIELDS[key]!;
      const unit = field.unit?.(system);
      const from = plainValue(event.before?.[key], unit);
      const to = plainValue(after[key], unit);
      if (from === 'nothing') return `recorded the ${field.name} of ${where}: ${to}`;
      if (to === 'nothing') return `cleared the ${field.name} of ${where} (was ${from})`;
      // The unit once, at the end, when both values carry it: "from 4.1 to 4.2 lb".
      const bare = plainValue(event.before?.[key], undefined);
      const sameUnit = typeof event.before?.[key] === 'number' && typeof after[key] === 'number';
      return `changed the ${field.name} of ${where} from ${sameUnit ? bare : from} to ${to}`;
    });
}

/** One sentence for one event (several changes joined with "and"). */
export function describeEvent(
  event: EventForWords,
  context: { unitSystem: UnitSystem; names: ReadonlyMap<string, string> },
): string {
  const who = event.who;
  const where = event.strip ? `plot ${plotNumber(event.strip)}` : 'the site';
  const after = event.after ?? {};
  const person = (id: unknown) =>
    typeof id === 'string'
      ? (context.names.get(id) ?? 'someone no longer in the network')
      : 'nobody';
  switch (event.action) {
    case 'update':
    case 'import': {
      const parts = changes(event, context.unitSystem, where);
      const via = event.action === 'import' ? ' (from a CSV upload)' : '';
      return parts.length
        ? `${who} ${parts.join(', and ')}${via}`
        : `${who} saved ${where} without changes${via}`;
    }
    case 'create':
      return `${who} enrolled the site`;
    case 'randomize':
      return `${who} drew the strip map`;
    case 'calibrate': {
      const pct = typeof after.percentOfTarget === 'number' ? after.percentOfTarget : null;
      return `${who} recorded a seeder check${pct === null ? '' : `: it sowed ${pct} % of the target`}`;
    }
    case 'upload':
      return `${who} added a photo${event.strip ? ` of plot ${plotNumber(event.strip)}` : ''}`;
    case 'handed_over':
      return after.growerUserId
        ? `${who} handed the site to ${person(after.growerUserId)}`
        : `${who} left the site without a grower`;
    case 'grower_removed':
      return `${who} removed ${person(event.before?.growerUserId)} from the network, so the site has no grower until it is handed on`;
    case 'marked_lost':
      return `${who} marked the site lost: ${String(after.lostReason ?? '')}`;
    case 'lost_withdrawn':
      return `${who} took back the mark that the site was lost`;
    case 'naming_changed':
      return after.namedInReports
        ? `${who} chose to have the farm named in network reports`
        : `${who} chose a neutral label for the farm in network reports`;
    default:
      return `${who} changed ${where}`;
  }
}
