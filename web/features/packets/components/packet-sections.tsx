// The field packet's sections, one component each, all taking the same site, layout and design
// facts, so a packet section is one component and one line in FieldPacket.
import { Link } from 'react-router-dom';
import { calibrationRows, packetUnits } from '../../../../shared/design/packet-numbers';
import { seedGrams } from '../../../../shared/labels/labels';
import type { Layout } from '../../../../shared/schemas/layout';
import type { SiteDetail } from '../../../../shared/schemas/site';
import { StripMap } from './strip-map';
import { RecordingSheet } from './recording-sheet';

const one = new Intl.NumberFormat('en', { maximumFractionDigits: 1 });

export interface PacketSectionProps {
  site: SiteDetail;
  layout: Layout;
}

/** Lengths in the trial's unit system (1 ft = 0.3048 m, 1 in = 2.54 cm, exact). */
function lengthsFor(trial: SiteDetail['trial']) {
  const units = packetUnits(trial.unitSystem);
  return {
    length: (feet: number | null) =>
      feet === null ? '—' : `${one.format(units.fromFeet(feet))} ${units.length}`,
    spacing: (inches: number | null) =>
      inches === null ? '—' : `${one.format(units.rowSpacing(inches))} ${units.spacing}`,
    perRowLength: units.perRowLength,
    rowUnit: units.length,
  };
}

/** Every strip with its block, in sowing order. */
export function packetStrips(layout: Layout) {
  return layout.blocks.flatMap((b) => b.strips.map((s) => ({ ...s, block: b.block })));
}

export function Section({
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
  // Seeds per length of row from the design itself (not the layout's rounded per-foot figure),
  // so this table and the seeder check show the same number.
  const perRow = new Map(
    calibrationRows(t, t.unitSystem).map((r) => [
      `${r.label}|${r.multiplier}`,
      r.seedsPerRowLength,
    ]),
  );
  const seedsPerRow = (s: { label: string; rate: number; seedsPerFootOfRow: number | null }) =>
    perRow.get(`${s.label}|${s.rate}`) ??
    (s.seedsPerFootOfRow === null ? null : perRowLength(s.seedsPerFootOfRow));
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
                  {seedsPerRow(s) === null ? '—' : one.format(seedsPerRow(s)!)}
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
