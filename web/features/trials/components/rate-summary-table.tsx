// For every rate level, in the trial's unit system: seeds per metre or foot of row, seeds per m²
// or ft², kg/ha or lb/acre (an imperial trial also shows kg/ha), and grams per strip.
import { packetUnits } from '../../../../shared/design/packet-numbers';
import type { RateTableRow } from '../../../../shared/design/rate-table';
import type { UnitSystem } from '../../../../shared/schemas/trial';

const one = new Intl.NumberFormat('en', { maximumFractionDigits: 1 });
const whole = new Intl.NumberFormat('en', { maximumFractionDigits: 0 });

/** The table's number columns for a unit system: heading and value of a row. */
function rateColumns(system: UnitSystem): [string, (r: RateTableRow) => number][] {
  const units = packetUnits(system);
  const perRow: [string, (r: RateTableRow) => number] = [
    `Seeds / ${units.length} of row`,
    (r) => units.perRowLength(r.seedsPerFootOfRow),
  ];
  if (system === 'metric') {
    return [
      perRow,
      ['Seeds / m²', (r) => r.seedsPerSquareMetre],
      ['kg / ha', (r) => r.kilogramsPerHectare],
    ];
  }
  return [
    perRow,
    ['Seeds / ft²', (r) => r.seedsPerSquareFoot],
    ['lb / acre', (r) => r.poundsPerAcre],
    ['kg / ha', (r) => r.kilogramsPerHectare],
  ];
}

export function RateSummaryTable({
  rows,
  caption,
  unitSystem,
}: {
  rows: RateTableRow[];
  caption?: string;
  unitSystem: UnitSystem;
}) {
  if (rows.length === 0) return null;
  const columns = rateColumns(unitSystem);
  return (
    // A scrolling box takes keyboard focus so it can be scrolled without a mouse.
    <div
      className="overflow-x-auto rounded-field border border-line"
      tabIndex={0}
      role="region"
      aria-label={caption ?? 'Seed per rate'}
    >
      <table
        className="figures w-full min-w-[34rem] border-collapse text-label"
        data-testid="rate-summary"
      >
        {caption ? <caption className="sr-only">{caption}</caption> : null}
        <thead className="bg-sunken text-left text-caption uppercase tracking-wide text-ink-muted">
          <tr>
            <th scope="col" className="px-3 py-2">
              Rate
            </th>
            {columns.map(([heading]) => (
              <th key={heading} scope="col" className="px-3 py-2 text-right">
                {heading}
              </th>
            ))}
            <th scope="col" className="px-3 py-2 text-right">
              g per strip
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={`${r.multiplier}-${r.label}`} className="border-t border-line">
              <th scope="row" className="px-3 py-2 text-left font-semibold">
                {r.label} <span className="font-normal text-ink-muted">×{r.multiplier}</span>
              </th>
              {columns.map(([heading, value]) => (
                <td key={heading} className="px-3 py-2 text-right">
                  {one.format(value(r))}
                </td>
              ))}
              <td className="px-3 py-2 text-right font-semibold">
                {whole.format(r.gramsPerStrip)}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
