// `/sites/:siteId/packet`: the printable field packet (print or "Save as PDF" from the browser).
import { Link } from 'react-router-dom';
import { Button, ButtonLink } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { LoadingBlock } from '../../../components/ui/spinner';
import { FieldPacket } from '../../../features/packets/components/field-packet';
import {
  siteBackLink,
  SiteLayoutErrorBoundary,
  siteLayoutLoader,
  useSiteWithLayout,
} from './site-layout-route';

export const clientLoader = siteLayoutLoader;
export const ErrorBoundary = SiteLayoutErrorBoundary;

export default function PacketPage() {
  const loaded = useSiteWithLayout();
  if (!loaded) return <LoadingBlock />;
  const { site, layout } = loaded;
  const back = siteBackLink(site);
  if (!site.randomized) {
    return (
      <EmptyState
        titleAs="h1"
        title="The packet is not ready yet"
        action={
          <ButtonLink to={back.to} variant="secondary">
            Back to {back.label}
          </ButtonLink>
        }
      >
        Your coordinator sends it once the strips of this site are randomized.
      </EmptyState>
    );
  }
  return (
    <>
      <div className="no-print mb-6 space-y-3">
        <Link
          to={back.to}
          className="inline-flex min-h-11 items-center gap-1.5 text-label font-semibold text-accent no-underline hover:underline"
        >
          <span aria-hidden="true">←</span>
          {back.label}
        </Link>
        <div className="flex flex-wrap items-center justify-between gap-3 rounded-card border border-line bg-surface p-4 shadow-card">
          <p className="text-label font-normal text-ink-muted">
            Print it, or choose “Save as PDF” in the print dialog. A4 and Letter both fit.
          </p>
          <Button onClick={() => window.print()}>Print the packet</Button>
        </div>
      </div>
      <FieldPacket site={site} layout={layout} />
    </>
  );
}
