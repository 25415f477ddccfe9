// The printable field packet for one site: map, seed to weigh, seeder check, what to count and
// when, a blank recording sheet for every strip, and the safety cautions.
import { PRINT } from '../../../../shared/brand/colours';
import type { Layout } from '../../../../shared/schemas/layout';
import type { SiteDetail } from '../../../../shared/schemas/site';
import { PacketCalibrateSection, PacketCountingSection } from './packet-check-sections';
import {
  PacketHeader,
  PacketMapSection,
  PacketSafetySection,
  PacketSeedSection,
  PacketSheetSection,
} from './packet-sections';

const PRINT_CSS = `
@media print {
  @page { size: auto; margin: 12mm; }
  html, body { background: ${PRINT.paper} !important; }
  .field-packet { font-size: 10.5pt; color: ${PRINT.ink}; }
  .field-packet section { break-inside: auto; }
  .field-packet .packet-page { break-before: page; }
  .field-packet h2 { break-after: avoid; }
  .field-packet tr, .field-packet li { break-inside: avoid; }
  .field-packet .strip-map { max-width: var(--map-print-width, 120mm); }
  .field-packet .strip-map figcaption { break-inside: avoid; }
  .field-packet .screen-only { display: none !important; }
  .field-packet .sheet td { height: 9mm; }
  .field-packet a { color: ${PRINT.ink}; text-decoration: none; }
  main, #root > div { padding: 0 !important; margin: 0 !important; max-width: none !important; }
}
`;

export function FieldPacket({ site, layout }: { site: SiteDetail; layout: Layout }) {
  return (
    <article className="field-packet mx-auto max-w-4xl space-y-8">
      <style>{PRINT_CSS}</style>
      <PacketHeader site={site} layout={layout} />
      <PacketMapSection site={site} layout={layout} />
      <PacketSeedSection site={site} layout={layout} />
      <PacketCalibrateSection site={site} layout={layout} />
      <PacketCountingSection site={site} layout={layout} />
      <PacketSheetSection site={site} layout={layout} />
      <PacketSafetySection site={site} layout={layout} />
    </article>
  );
}
