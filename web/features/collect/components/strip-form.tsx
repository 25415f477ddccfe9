// The per-strip form for a phone: large inputs with numeric keyboards, units from the trial,
// derived values and warnings as you type; every change is kept on the device and sent.
import type { SiteStrips, StripDto } from '../../../../shared/schemas/strip';
import { Alert } from '../../../components/ui/alert';
import { ButtonLink } from '../../../components/ui/button';
import { queueEdit, useStripOutbox } from '../lib/outbox';
import { neighbours } from '../lib/strip-order';
import { effectiveValues, liveDerived } from '../lib/strip-values';
import { ConflictPanel } from './conflict-panel';
import { StripPhotos } from './photo-panel';
import {
  DatesSection,
  GrainSection,
  HeadSection,
  NotesSection,
  StandSection,
  TillerSection,
  type StripSectionProps,
} from './strip-form-sections';

function Warnings({ warnings }: { warnings: string[] }) {
  if (warnings.length === 0) return null;
  return (
    <Alert tone="caution" title="Check these numbers">
      <ul className="list-disc space-y-1 pl-4" data-testid="strip-warnings">
        {warnings.map((w) => (
          <li key={w}>{w}</li>
        ))}
      </ul>
      <p className="mt-1 text-caption">
        Warnings never stop saving: fix the number if it was a slip, or leave a note.
      </p>
    </Alert>
  );
}

/** Links to the strips before and after this one in field order, by plot number. */
function StripNeighbours({ data, strip }: { data: SiteStrips; strip: StripDto }) {
  const { siteId } = data.site;
  const { previous, next } = neighbours(data.strips, strip.stripId);
  return (
    <nav aria-label="Other strips" className="flex justify-between gap-2 pt-2">
      {previous ? (
        <ButtonLink variant="secondary" to={`/sites/${siteId}/strips/${previous.stripId}`}>
          ← Plot {previous.plotNumber}
        </ButtonLink>
      ) : (
        <span />
      )}
      {next ? (
        <ButtonLink variant="secondary" to={`/sites/${siteId}/strips/${next.stripId}`}>
          Plot {next.plotNumber} →
        </ButtonLink>
      ) : (
        <ButtonLink variant="secondary" to={`/sites/${siteId}`}>
          All strips
        </ButtonLink>
      )}
    </nav>
  );
}

export function StripForm({ data, strip }: { data: SiteStrips; strip: StripDto }) {
  const { site } = data;
  const entry = useStripOutbox(strip.stripId);
  const values = effectiveValues(strip, entry);
  const { derived, warnings } = liveDerived(site, strip, values);
  const section: StripSectionProps = {
    site,
    strip,
    derived,
    common: {
      values,
      onPatch: (patch) => queueEdit(strip, patch),
      disabled: !site.canEdit,
      strip,
      entry,
    },
  };

  return (
    <div className="mx-auto max-w-xl space-y-4">
      {entry ? <ConflictPanel entry={entry} /> : null}
      <Warnings warnings={warnings} />
      <StandSection {...section} />
      <TillerSection {...section} />
      <HeadSection {...section} />
      <GrainSection {...section} />
      <DatesSection {...section} />
      <NotesSection {...section} />
      <StripPhotos siteId={site.siteId} stripId={strip.stripId} canUpload={site.canEdit} />
      <StripNeighbours data={data} strip={strip} />
    </div>
  );
}
