// The field packet's seeder check and counting guide, in the trial's unit system: a metric
// trial calibrates per metre of row and counts in 1 m of row; an imperial trial per foot and in
// 3 ft of row. The numbers come from shared/design/packet-numbers.
import { Link } from 'react-router-dom';
import {
  calibrationRows,
  countingNumbers,
  type PacketUnits,
} from '../../../../shared/design/packet-numbers';
import { Section, type PacketSectionProps } from './packet-sections';

const one = new Intl.NumberFormat('en', { maximumFractionDigits: 1 });
const whole = new Intl.NumberFormat('en', { maximumFractionDigits: 0 });
const cell = 'py-1.5 pr-2 text-right';

/** "1 m" or "3 ft": the counting stick or the wheel, with its unit. */
const lengthOf = (value: number, units: PacketUnits) => `${value} ${units.length}`;

function CalibrationSteps({ units }: { units: PacketUnits }) {
  return (
    <ol className="list-decimal space-y-1.5 pl-5 text-label font-normal">
      <li>
        Measure the drive wheel: roll it one full turn on a flat floor and measure the distance, in{' '}
        {units.system === 'metric' ? 'metres' : 'feet'}. That is its circumference.
      </li>
      <li>
        Lift the seeder so the wheel turns freely, put a bowl or bag under one row outlet and fill
        the hopper with this trial’s seed.
      </li>
      <li>
        Turn the wheel a set number of times (5 or 10) at walking speed and count the seeds that
        fell.
      </li>
      <li>
        Target seeds per turn = seeds per {units.lengthWord} of row × circumference ({units.length}
        ). Compare your count with the target × turns.
      </li>
      <li>
        Adjust the plate, cups or opening and repeat until you are within about 5 % — then do the
        same for the next rate.
      </li>
    </ol>
  );
}

function CalibrationTable({ site, units }: PacketSectionProps & { units: PacketUnits }) {
  const t = site.trial;
  const rows = calibrationRows(t, t.unitSystem);
  if (rows.length === 0) return null;
  const wheel = lengthOf(units.wheelCircumference, units);
  // Seeds per m² run in the hundreds; per ft² in tens, where a tenth still matters.
  const perArea = units.system === 'metric' ? whole : one;
  return (
    // A scrolling box takes keyboard focus so it can be scrolled without a mouse.
    <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Seeder check">
      <table
        className="figures w-full max-w-2xl border-collapse text-label"
        data-testid="calibration-table"
      >
        <thead>
          <tr className="border-b-2 border-ink text-left">
            <th className="py-1 pr-2">Rate</th>
            <th className="py-1 pr-2 text-right">{units.rate}</th>
            <th className="py-1 pr-2 text-right">Seeds / {units.area}</th>
            <th className="py-1 pr-2 text-right">Seeds / {units.length} of row</th>
            <th className="py-1 pr-2 text-right">Per turn of a {wheel} wheel</th>
            <th className="py-1 text-right">Per 10 turns</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.label} className="border-b border-line">
              <td className="py-1.5 pr-2">
                {r.label} ×{r.multiplier}
              </td>
              <td className={cell}>{one.format(r.rate)}</td>
              <td className={cell}>{perArea.format(r.seedsPerArea)}</td>
              <td className={cell}>{one.format(r.seedsPerRowLength)}</td>
              <td className={cell}>{whole.format(r.seedsPerTurn)}</td>
              <td className="py-1.5 text-right">{whole.format(r.seedsPerTenTurns)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function PacketCalibrateSection({ site, layout }: PacketSectionProps) {
  const units = countingNumbers(site.trial, site.trial.unitSystem).units;
  return (
    <Section id="calibrate" title="3. Check your seeder before you sow">
      <CalibrationSteps units={units} />
      <CalibrationTable site={site} layout={layout} units={units} />
      <p className="text-caption text-ink-muted">
        Rates are the trial’s full rate times each level, in {units.rate} and seeds per {units.area}
        . Different wheel? Sheaf’s{' '}
        <Link to={`/calibrate?site=${site.id}`}>seeder calibration helper</Link> (the Calibrate
        page) works it out and, when you are signed in, saves the check to this site. Wheel slip in
        soft soil makes the field rate a little lower than the bowl test.
      </p>
    </Section>
  );
}

/** How a stand count along the stick becomes plants per area, with this trial's spacing. */
function standFormula(units: PacketUnits, spacingInches: number | null, perPlant: number | null) {
  const stick = lengthOf(units.countLength, units);
  const formula =
    units.system === 'metric'
      ? `Plants/m² = count in ${stick} × 100 ÷ row spacing in cm`
      : `Plants/ft² = (count in ${stick} × 4) ÷ row spacing in inches`;
  if (spacingInches === null || perPlant === null) return `${formula}.`;
  const spacing = `${one.format(units.rowSpacing(spacingInches))} ${units.spacing}`;
  return `${formula}: at this trial’s ${spacing} rows, each plant counted is ${one.format(perPlant)} plants/${units.area}.`;
}

function ExpectedStand({ site }: PacketSectionProps) {
  const t = site.trial;
  const { units, rows } = countingNumbers(t, t.unitSystem);
  if (rows.length === 0) return null;
  const stick = lengthOf(units.countLength, units);
  return (
    <table className="figures w-full max-w-xl border-collapse text-label" data-testid="stand-table">
      <caption className="pb-1 text-left text-caption text-ink-muted">
        What a stand count in {stick} of row should come to: seeds sown × {t.germinationPct ?? 100}{' '}
        % germination × {t.emergencePct ?? 100} % expected emergence.
      </caption>
      <thead>
        <tr className="border-b-2 border-ink text-left">
          <th className="py-1 pr-2">Rate</th>
          <th className="py-1 pr-2 text-right">Seeds sown in {stick} of row</th>
          <th className="py-1 text-right">Plants expected in {stick} of row</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.label} className="border-b border-line">
            <td className="py-1.5 pr-2">
              {r.label} ×{r.multiplier}
            </td>
            <td className={cell}>{whole.format(r.seedsInCount)}</td>
            <td className="py-1.5 text-right">{whole.format(r.expectedPlantsInCount)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function CountingTable({ site }: PacketSectionProps) {
  const t = site.trial;
  const { units, areaPerPlantCounted } = countingNumbers(t, t.unitSystem);
  const stick = lengthOf(units.countLength, units);
  const harvestRows = t.rowsPerStrip ? Math.max(1, t.rowsPerStrip - 2 * (t.borderRows ?? 0)) : null;
  const td = 'py-1.5 pr-2';
  return (
    <table className="w-full border-collapse text-label" data-testid="counting-table">
      <thead>
        <tr className="border-b-2 border-ink text-left">
          <th className="py-1 pr-2">What</th>
          <th className="py-1 pr-2">When (growth stage)</th>
          <th className="py-1">How</th>
        </tr>
      </thead>
      <tbody className="align-top">
        <tr className="border-b border-line">
          <td className={`${td} font-semibold`}>Stand count (plants)</td>
          <td className={td}>2–3 leaves, before tillers show: Zadoks 12–13 (seedling), Feekes 1</td>
          <td className="py-1.5">
            Plants along {stick} of row, 6 spots per strip.{' '}
            {standFormula(units, t.rowSpacingIn, areaPerPlantCounted)}
          </td>
        </tr>
        <tr className="border-b border-line">
          <td className={`${td} font-semibold`}>Tillers</td>
          <td className={td}>
            Start of stem elongation: Feekes 5 = Zadoks 30 (winter wheat: also at green-up, Feekes
            3)
          </td>
          <td className="py-1.5">
            Dig or pull 10 plants in a row; count tillers with at least 3 leaves.
          </td>
        </tr>
        <tr className="border-b border-line">
          <td className={`${td} font-semibold`}>Heads</td>
          <td className={td}>
            After heading is complete, Feekes 10.5 (Zadoks 5x, ear emergence), up to ripening
          </td>
          <td className="py-1.5">
            Heads along {stick} of row, 4 spots per strip; later counts are more reliable.
          </td>
        </tr>
        <tr className="border-b border-line">
          <td className={`${td} font-semibold`}>Grain</td>
          <td className={td}>Ripe: Feekes 11 (Zadoks 9x, ripening)</td>
          <td className="py-1.5">
            Cut{' '}
            {harvestRows
              ? `the middle ${harvestRows} row${harvestRows > 1 ? 's' : ''}`
              : 'the middle rows'}{' '}
            over a measured length, thresh, clean and weigh in {units.weight}; measure moisture %
            the same day. Write the rows and the length ({units.length}) you harvested.
          </td>
        </tr>
      </tbody>
    </table>
  );
}

export function PacketCountingSection({ site, layout }: PacketSectionProps) {
  const units = countingNumbers(site.trial, site.trial.unitSystem).units;
  return (
    <Section id="counting" title="4. What to count, and when" newPage>
      <p className="text-label font-normal">
        Count in the middle rows of each strip, away from the strip ends and border rows. Use a{' '}
        {lengthOf(units.countLength, units)} stick (or another length — write down which) laid along
        one row; count at 6 or more spots per strip, skipping the very best and worst patches.
      </p>
      <CountingTable site={site} layout={layout} />
      <ExpectedStand site={site} layout={layout} />
      <p className="text-caption text-ink-muted">
        A stage is reached when about half the main stems show it. Record dates of sowing,
        emergence, heading and harvest at the top of this packet.
      </p>
    </Section>
  );
}
