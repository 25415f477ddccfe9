// For every rate level: seeds per foot of row, seeds/ft², lb/acre, kg/ha and grams per strip.
import type { RateTableRow } from '../../../../shared/design/rate-table';

const one = new Intl.NumberFormat('en', { maximumFractionDigits: 1 });
const whole = new Intl.NumberFormat('en', { maximumFractionDigits: 0 });

export function RateSummaryTable({ rows, caption }: { rows: RateTableRow[]; caption?: string }) {
  if (rows.length === 0) return null;
  return (
    // A scrolling box takes keyboard focus so it can be scrolled without a mouse.
    <div
      className="overflow-x-auto rounded-field border border-line"
      tabIndex={0}
      role="region"
      aria-label={caption ?? 'Seed per rate'}
    >
      <table className="figures w-full min-w-[34rem] border-collapse text-label">
        {caption ? <caption className="sr-only">{caption}</caption> : null}
        <thead className="bg-sunken text-left text-caption uppercase tracking-wide text-ink-muted">
          <tr>
            <th scope="col" className="px-3 py-2">
              Rate
            </th>
            <th scope="col" className="px-3 py-2 text-right">
              Seeds / ft of row
            </th>
            <th scope="col" className="px-3 py-2 text-right">
              Seeds / ft²
            </th>
            <th scope="col" className="px-3 py-2 text-right">
              lb / acre
            </th>
            <th scope="col" className="px-3 py-2 text-right">
              kg / ha
            </th>
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
              <td className="px-3 py-2 text-right">{one.format(r.seedsPerFootOfRow)}</td>
              <td className="px-3 py-2 text-right">{one.format(r.seedsPerSquareFoot)}</td>
              <td className="px-3 py-2 text-right">{one.format(r.poundsPerAcre)}</td>
              <td className="px-3 py-2 text-right">{one.format(r.kilogramsPerHectare)}</td>
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
