// The packet's blank recording sheet: one row per strip, a unit on every column, and the rows
// and length harvested that the yield needs.
import type { UnitSystem } from '../../../../shared/schemas/trial';

export interface SheetStrip {
  stripId: string;
  block: number;
  position: number;
  label: string;
}

/** The counting length and the units the sheet asks for, in the trial's unit system. */
export function sheetUnits(system: UnitSystem) {
  return system === 'metric'
    ? { countLength: '1 m', length: 'm', weight: 'kg' }
    : { countLength: '3 ft', length: 'ft', weight: 'lb' };
}

const cell = 'border border-ink px-1 py-1';

export function RecordingSheet({
  strips,
  unitSystem,
}: {
  strips: readonly SheetStrip[];
  unitSystem: UnitSystem;
}) {
  const u = sheetUnits(unitSystem);
  return (
    <>
      <p className="text-caption text-ink-muted">
        Stand and head counts are plants or heads per {u.countLength} of row unless you write
        another length beside them. At harvest, write how many rows and what length of each strip
        you cut: the yield is worked out from that area. Enter the numbers in Sheaf after each
        count. Plot 203 is block 2, strip 3.
      </p>
      <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Field sheet">
        <table
          className="sheet figures w-full min-w-[50rem] border-collapse text-caption"
          data-testid="recording-sheet"
        >
          <thead>
            <tr className="text-left">
              <th className={cell} rowSpan={2}>
                Plot (block, strip)
              </th>
              <th className={cell} rowSpan={2}>
                Rate
              </th>
              <th className={`${cell} text-center`} colSpan={6}>
                Stand count (plants per {u.countLength} of row)
              </th>
              <th className={cell} rowSpan={2}>
                Tillers (per 10 plants)
              </th>
              <th className={`${cell} text-center`} colSpan={4}>
                Heads (per {u.countLength} of row)
              </th>
              <th className={cell} rowSpan={2}>
                Rows harvested (rows)
              </th>
              <th className={cell} rowSpan={2}>
                Length harvested ({u.length})
              </th>
              <th className={cell} rowSpan={2}>
                Threshed grain weight ({u.weight})
              </th>
              <th className={cell} rowSpan={2}>
                Grain moisture (%)
              </th>
            </tr>
            <tr>
              {[1, 2, 3, 4, 5, 6, 1, 2, 3, 4].map((n, i) => (
                <th key={i} className="w-8 border border-ink px-1 py-0.5 text-center font-normal">
                  {n}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {strips.map((s) => (
              <tr key={s.stripId}>
                <td className="h-9 border border-ink px-1 font-semibold">
                  {s.block * 100 + s.position}{' '}
                  <span className="font-normal text-ink-muted">
                    ({s.block}, {s.position})
                  </span>
                </td>
                <td className="border border-ink px-1">{s.label}</td>
                {Array.from({ length: 15 }, (_, i) => (
                  <td key={i} className="border border-ink" />
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
