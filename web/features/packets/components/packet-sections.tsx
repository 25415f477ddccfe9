// The field packet's sections, one component each, all taking the same site, layout and design
// facts, so a packet section is one component and one line in FieldPacket.
import { Link } from 'react-router-dom';
import { rateTable } from '../../../../shared/design/rate-table';
import { seedGrams } from '../../../../shared/labels/labels';
import type { Layout } from '../../../../shared/schemas/layout';
import type { SiteDetail } from '../../../../shared/schemas/site';
import { METRES_PER_FOOT } from '../../../../shared/units/constants';
import { StripMap } from './strip-map';
import { RecordingSheet } from './recording-sheet';

const one = new Intl.NumberFormat('en', { maximumFractionDigits: 1 });
const whole = new Intl.NumberFormat('en', { maximumFractionDigits: 0 });

export interface PacketSectionProps {
  site: SiteDetail;
  layout: Layout;
}

/** Lengths in the trial's unit system (1 ft = 0.3048 m, 1 in = 2.54 cm, exact). */
function lengthsFor(trial: SiteDetail['trial']) {
  const metric = trial.unitSystem === 'metric';
  return {
    length: (feet: number | null) =>
      feet === null ? '—' : metric ? `${one.format(feet * METRES_PER_FOOT)} m` : `${feet} ft`,
    spacing: (inches: number | null) =>
      inches === null
        ? '—'
        : metric
          ? `${one.format((inches * METRES_PER_FOOT * 100) / 12)} cm`
          : `${inches} in`,
    perRowLength: (perFoot: number) => (metric ? perFoot / METRES_PER_FOOT : perFoot),
    rowUnit: metric ? 'm' : 'ft',
  };
}

/** Every strip with its block, in sowing order. */
export function packetStrips(layout: Layout) {
  return layout.blocks.flatMap((b) => b.strips.map((s) => ({ ...s, block: b.block })));
}

function Section({
  id,
  title,
  children,
  newPage = false,
}: {
  id: string;
  title: string;
  children: React.ReactNode;
  newPage?: boolean;
}) {
  return (
    <section
      id={id}
      aria-labelledby={`${id}-title`}
      className={`${newPage ? 'packet-page ' : ''}space-y-3 border-t-2 border-ink pt-4`}
    >
      <h2 id={`${id}-title`} className="text-heading text-ink">
        {title}
      </h2>
      {children}
    </section>
  );
}

export function PacketHeader({ site, layout }: PacketSectionProps) {
  const t = site.trial;
  const strips = packetStrips(layout);
  const { length, spacing } = lengthsFor(t);
  return (
    <header className="space-y-1">
      <p className="text-caption font-semibold uppercase tracking-wider text-straw-700">
        Field packet · {site.networkName}
      </p>
      <h1 className="text-title text-ink">
        {site.fieldName} — {t.name}
      </h1>
      <p className="text-ink-muted">
        {t.cropName ?? 'Crop'} {t.season ? `· season ${t.season}` : ''} · grower{' '}
        {site.grower.name ?? site.grower.email ?? '—'} · {t.blocksPerSite} blocks ×{' '}
        {t.rateLevels.length} rates = {strips.length} strips of {t.rowsPerStrip} rows at{' '}
        {spacing(t.rowSpacingIn)}, {length(t.stripLengthFt)} long
        {t.borderRows ? `, ${t.borderRows} border row${t.borderRows > 1 ? 's' : ''} each side` : ''}
        .
      </p>
      <dl className="grid grid-cols-2 gap-x-6 gap-y-1 pt-2 text-label sm:grid-cols-4">
        {[
          ['Sowing date', site.sowingDate],
          ['Emergence date', site.emergenceDate],
          ['Heading date', site.headingDate],
          ['Harvest date', site.harvestDate],
        ].map(([label, value]) => (
          <div key={label}>
            <dt className="text-ink-muted">{label}</dt>
            <dd className="min-h-6 border-b border-ink/50">{value ?? ''}</dd>
          </div>
        ))}
      </dl>
    </header>
  );
}

export function PacketMapSection({ site, layout }: PacketSectionProps) {
  return (
    <Section id="map" title="1. Strip map">
      <p className="text-label font-normal">
        Sow the strips in this order, starting from one edge you mark with a stake. Every block
        holds each rate once; keep the blocks in the order shown.
      </p>
      <StripMap
        layout={layout}
        title={`Strip map for ${site.fieldName}: ${layout.blocks.length} blocks`}
      />
    </Section>
  );
}

export function PacketSeedSection({ site, layout }: PacketSectionProps) {
  const t = site.trial;
  const strips = packetStrips(layout);
  const { length, perRowLength, rowUnit } = lengthsFor(t);
  const rowLength = t.stripLengthFt ? length(t.stripLengthFt) : 'the strip length';
  return (
    <Section id="seed" title="2. Seed to weigh for each strip" newPage>
      <p className="text-label font-normal">
        Weigh each strip’s seed into its own envelope and write the block, strip number and rate on
        it. Amounts are seeds sown at the trial’s rate for {t.rowsPerStrip} rows × {rowLength}
        {t.thousandKernelWeightG
          ? `, with seed at ${t.thousandKernelWeightG} g per 1,000 seeds`
          : ''}
        . If your seed lot differs, tell your coordinator before you weigh.
      </p>
      {/* A scrolling box takes keyboard focus so it can be scrolled without a mouse. */}
      <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Seed per strip">
        <table className="figures w-full border-collapse text-label">
          <thead>
            <tr className="border-b-2 border-ink text-left">
              <th className="py-1 pr-2">Plot</th>
              <th className="py-1 pr-2">Block</th>
              <th className="py-1 pr-2">Strip</th>
              <th className="py-1 pr-2">Rate</th>
              <th className="py-1 pr-2 text-right">Seeds / {rowUnit} of row</th>
              <th className="py-1 pr-2 text-right">Grams</th>
              <th className="py-1 text-center">Weighed ✓</th>
            </tr>
          </thead>
          <tbody>
            {strips.map((s) => (
              <tr key={s.stripId} className="border-b border-line">
                <td className="py-1.5 pr-2 font-semibold">{s.plotNumber}</td>
                <td className="py-1.5 pr-2">{s.block}</td>
                <td className="py-1.5 pr-2">{s.position}</td>
                <td className="py-1.5 pr-2">
                  {s.label} ×{s.rate}
                </td>
                <td className="py-1.5 pr-2 text-right">
                  {s.seedsPerFootOfRow === null
                    ? '—'
                    : one.format(perRowLength(s.seedsPerFootOfRow))}
                </td>
                <td className="py-1.5 pr-2 text-right font-semibold">{seedGrams(s.seedGrams)}</td>
                <td className="py-1.5 text-center">☐</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </Section>
  );
}

export function PacketCalibrateSection({ site }: PacketSectionProps) {
  const t = site.trial;
  const rows = rateTable({ ...t, rateLevels: t.rateLevels });
  return (
    <Section id="calibrate" title="3. Check your seeder before you sow">
      <ol className="list-decimal space-y-1.5 pl-5 text-label font-normal">
        <li>
          Measure the drive wheel: roll it one full turn on a flat floor and measure the distance,
          in feet. That is its circumference.
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
          Target seeds per turn = seeds per foot of row × circumference (ft). Compare your count
          with the target × turns.
        </li>
        <li>
          Adjust the plate, cups or opening and repeat until you are within about 5 % — then do the
          same for the next rate.
        </li>
      </ol>
      {rows.length > 0 ? (
        <table className="figures w-full max-w-xl border-collapse text-label">
          <thead>
            <tr className="border-b-2 border-ink text-left">
              <th className="py-1 pr-2">Rate</th>
              <th className="py-1 pr-2 text-right">Seeds / ft of row</th>
              <th className="py-1 pr-2 text-right">Per turn of a 3-ft wheel</th>
              <th className="py-1 text-right">Per 10 turns</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.label} className="border-b border-line">
                <td className="py-1.5 pr-2">
                  {r.label} ×{r.multiplier}
                </td>
                <td className="py-1.5 pr-2 text-right">{one.format(r.seedsPerFootOfRow)}</td>
                <td className="py-1.5 pr-2 text-right">{whole.format(r.seedsPerFootOfRow * 3)}</td>
                <td className="py-1.5 text-right">{whole.format(r.seedsPerFootOfRow * 30)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : null}
      <p className="text-caption text-ink-muted">
        Different wheel? Sheaf’s{' '}
        <Link to={`/calibrate?site=${site.id}`}>seeder calibration helper</Link> (the Calibrate
        page) works it out and, when you are signed in, saves the check to this site. Wheel slip in
        soft soil makes the field rate a little lower than the bowl test.
      </p>
    </Section>
  );
}

export function PacketCountingSection({ site }: PacketSectionProps) {
  const t = site.trial;
  const harvestRows = t.rowsPerStrip ? Math.max(1, t.rowsPerStrip - 2 * (t.borderRows ?? 0)) : null;
  return (
    <Section id="counting" title="4. What to count, and when" newPage>
      <p className="text-label font-normal">
        Count in the middle rows of each strip, away from the strip ends and border rows. Use a 3-ft
        stick (or a 1-m stick — write down which) laid along one row; count at 6 or more spots per
        strip, skipping the very best and worst patches.
      </p>
      <table className="w-full border-collapse text-label">
        <thead>
          <tr className="border-b-2 border-ink text-left">
            <th className="py-1 pr-2">What</th>
            <th className="py-1 pr-2">When (growth stage)</th>
            <th className="py-1">How</th>
          </tr>
        </thead>
        <tbody className="align-top">
          <tr className="border-b border-line">
            <td className="py-1.5 pr-2 font-semibold">Stand count (plants)</td>
            <td className="py-1.5 pr-2">
              2–3 leaves, before tillers show: Zadoks 12–13 (seedling), Feekes 1
            </td>
            <td className="py-1.5">
              Plants along 3 ft of row, 6 spots per strip. Plants/ft² = (count in 3 ft × 4) ÷ row
              spacing in inches.
            </td>
          </tr>
          <tr className="border-b border-line">
            <td className="py-1.5 pr-2 font-semibold">Tillers</td>
            <td className="py-1.5 pr-2">
              Start of stem elongation: Feekes 5 = Zadoks 30 (winter wheat: also at green-up, Feekes
              3)
            </td>
            <td className="py-1.5">
              Dig or pull 10 plants in a row; count tillers with at least 3 leaves.
            </td>
          </tr>
          <tr className="border-b border-line">
            <td className="py-1.5 pr-2 font-semibold">Heads</td>
            <td className="py-1.5 pr-2">
              After heading is complete, Feekes 10.5 (Zadoks 5x, ear emergence), up to ripening
            </td>
            <td className="py-1.5">
              Heads along 3 ft of row, 4 spots per strip; later counts are more reliable.
            </td>
          </tr>
          <tr className="border-b border-line">
            <td className="py-1.5 pr-2 font-semibold">Grain</td>
            <td className="py-1.5 pr-2">Ripe: Feekes 11 (Zadoks 9x, ripening)</td>
            <td className="py-1.5">
              Cut{' '}
              {harvestRows
                ? `the middle ${harvestRows} row${harvestRows > 1 ? 's' : ''}`
                : 'the middle rows'}{' '}
              over a measured length, thresh, clean and weigh; measure moisture % the same day.
              Write the rows and length you harvested.
            </td>
          </tr>
        </tbody>
      </table>
      <p className="text-caption text-ink-muted">
        A stage is reached when about half the main stems show it. Record dates of sowing,
        emergence, heading and harvest at the top of this packet.
      </p>
    </Section>
  );
}

export function PacketSheetSection({ site, layout }: PacketSectionProps) {
  return (
    <Section id="sheet" title="5. Recording sheet" newPage>
      <RecordingSheet strips={packetStrips(layout)} unitSystem={site.trial.unitSystem} />
    </Section>
  );
}

export function PacketSafetySection(_props: PacketSectionProps) {
  return (
    <Section id="safety" title="6. Work safely">
      <ul className="list-disc space-y-1.5 pl-5 text-label font-normal">
        <li>
          <strong>Treated seed:</strong> read the seed tag first. Wear unlined chemical-resistant
          gloves, long sleeves and trousers; keep dust down when you open bags. Never feed leftover
          seed to people or animals, keep it from children, and pick up spills.
        </li>
        <li>
          <strong>Walk-behind seeders and tillers:</strong> clear stones and wire first, keep guards
          on and people and pets away, know how to stop quickly, refuel only when the engine is
          cold, and stop the engine before you clear or adjust anything.
        </li>
        <li>
          <strong>Grain dust:</strong> thresh and clean grain outdoors or with moving air, wearing a
          NIOSH-approved particulate respirator (N95 or better) and eye protection.
        </li>
        <li>
          <strong>Hearing:</strong> tillers, threshers and cleaners are often louder than 85 dB;
          wear earplugs or muffs while they run.
        </li>
        <li>
          <strong>Local advice first:</strong> the trial’s rates are treatments to compare, not
          recommendations. Sowing dates, rates and fertility follow your local extension office, the
          seed label and local rules; the label is the law.
        </li>
      </ul>
      <p className="screen-only text-caption">
        More in <Link to="/cautions">Cautions</Link>.
      </p>
    </Section>
  );
}
