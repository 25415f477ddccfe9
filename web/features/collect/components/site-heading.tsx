// The top of a site's collect pages: trial and field, lock state, waiting edits and tabs.
import type { ReactNode } from 'react';
import type { SiteContext } from '../../../../shared/schemas/strip';
import { Alert } from '../../../components/ui/alert';
import { PageHeader, type BackTo } from '../../../components/ui/page-header';
import { formatDate } from '../../../lib/format';
import { CollectNav } from './collect-nav';
import { OutboxStatus } from './outbox-status';

export function SiteHeading({
  site,
  title,
  description,
  actions,
  back,
}: {
  site: SiteContext;
  title?: ReactNode;
  description?: ReactNode;
  actions?: ReactNode;
  /** Defaults to the trial page for coordinators and the grower's home for growers. */
  back?: BackTo;
}) {
  return (
    <>
      <PageHeader
        back={
          back ??
          (site.isCoordinator
            ? { to: `/trials/${site.trialId}`, label: site.trialName }
            : { to: '/', label: 'My sites' })
        }
        eyebrow={`${site.trialName}${site.cropName ? ` · ${site.cropName}` : ''}`}
        title={title ?? site.fieldName}
        description={description}
        actions={actions}
        className="mb-4"
      />
      {site.publishedAt ? (
        <Alert tone="info" title="Report published: data is read-only" className="mb-4">
          The report for this site was published on {formatDate(site.publishedAt)}. Ask the
          coordinator to unpublish it if a number needs correcting.
        </Alert>
      ) : null}
      <OutboxStatus siteId={site.siteId} className="mb-4" />
      <CollectNav siteId={site.siteId} isCoordinator={site.isCoordinator} />
    </>
  );
}
