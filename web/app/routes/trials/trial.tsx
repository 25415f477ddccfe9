// `/trials/:trialId`: design summary, sites with randomization and packets, and links onward.
import type { QueryClient } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { Link, useParams, useRouteError, type LoaderFunctionArgs } from 'react-router-dom';
import { rateTable } from '../../../../shared/design/rate-table';
import type { TrialDetail } from '../../../../shared/schemas/trial';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button, ButtonLink } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingBlock } from '../../../components/ui/spinner';
import { useMe } from '../../../features/auth/api/get-me';
import {
  trialQueryOptions,
  useTrial,
  useTrialPeople,
} from '../../../features/trials/api/get-trial';
import { SiteLifeActions } from '../../../features/trials/components/site-life-actions';
import { TrialLifePanel } from '../../../features/trials/components/trial-life-panel';
import { useSendAllPackets } from '../../../features/trials/api/trial-mutations';
import { EnrolSiteForm } from '../../../features/trials/components/enrol-site-form';
import { RateSummaryTable } from '../../../features/trials/components/rate-summary-table';
import { SitesTable } from '../../../features/trials/components/sites-table';
import { TrialDesignSummary } from '../../../features/trials/components/trial-design-summary';
import { countOf, cropLabel } from '../../../../shared/labels/labels';
import { errorSummary } from '../../../lib/form-errors';
import { trialStatusName } from '../../../lib/format';
import { isNotFound, NotFoundPanel } from '../../route-errors';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    await queryClient.ensureQueryData(trialQueryOptions(params.trialId!));
    return null;
  };

const linkClass =
  'inline-flex min-h-11 items-center rounded-field px-3 text-label font-semibold text-accent hover:bg-accent-soft';

/** Links onward: progress (coordinators), the pooled report and meeting view, the calculator. */
function TrialLinksCard({ trial }: { trial: TrialDetail }) {
  return (
    <Card>
      <h2 className="text-heading text-ink">Reports and tools</h2>
      <ul className="mt-2 flex flex-col">
        {trial.canEdit ? (
          <li>
            <Link className={linkClass} to={`/trials/${trial.id}/progress`}>
              Data progress
            </Link>
          </li>
        ) : null}
        {trial.canEdit || trial.pooledPublishedAt ? (
          <>
            <li>
              <Link className={linkClass} to={`/trials/${trial.id}/report`}>
                Pooled report
              </Link>
            </li>
            <li>
              <Link className={linkClass} to={`/trials/${trial.id}/meeting`}>
                Meeting view
              </Link>
            </li>
          </>
        ) : (
          <li className="px-3 py-2 text-label text-ink-muted">
            The pooled report appears here once the coordinator publishes it.
          </li>
        )}
        <li>
          <Link className={linkClass} to="/series">
            Series across seasons
          </Link>
        </li>
        <li>
          <Link className={linkClass} to="/calculator">
            Seed calculator
          </Link>
        </li>
      </ul>
    </Card>
  );
}

export default function TrialPage() {
  const { trialId } = useParams();
  const { data: trial } = useTrial(trialId!);
  const people = useTrialPeople(trialId!, trial?.canEdit ?? false);
  const { data: me } = useMe();
  const [enrolOpen, setEnrolOpen] = useState(false);
  const sendAll = useSendAllPackets(trialId!);
  const table = useMemo(
    () => (trial ? rateTable({ ...trial, rateLevels: trial.rateLevels }) : []),
    [trial],
  );
  if (!trial) return <LoadingBlock />;
  const active = trial.status === 'in-field' || trial.status === 'harvest-in';
  const crop =
    trial.crop === 'custom'
      ? (trial.customCrop?.name ?? cropLabel('custom'))
      : cropLabel(trial.crop);

  return (
    <>
      <PageHeader
        eyebrow={`${trial.networkName} · ${crop}${trial.season ? ` · ${trial.season}` : ''}`}
        title={
          <span className="flex flex-wrap items-center gap-3">
            {trial.name}
            <Badge tone={active ? 'field' : trial.status === 'draft' ? 'straw' : 'neutral'}>
              {trialStatusName(trial.status)}
            </Badge>
          </span>
        }
        description={trial.question || undefined}
        actions={
          trial.canEdit ? (
            <>
              <ButtonLink
                to={`/trials/${trial.id}/edit${trial.status === 'draft' ? '' : '?step=4'}`}
                variant={trial.status === 'draft' ? 'primary' : 'secondary'}
              >
                {trial.status === 'draft' ? 'Finish the design' : 'Edit design'}
              </ButtonLink>
              {active ? (
                <Button
                  variant="secondary"
                  busy={sendAll.isPending}
                  onClick={() => sendAll.mutate()}
                >
                  E-mail all packets
                </Button>
              ) : null}
            </>
          ) : null
        }
      />
      {trial.status === 'draft' && trial.canEdit ? (
        <Alert tone="caution" title="This trial is still a draft" className="mb-6">
          Finish the design to send it to the field; sites can be enrolled now and randomized once
          it is active.
        </Alert>
      ) : null}
      {sendAll.isSuccess ? (
        <Alert
          tone="success"
          className="mb-6"
          title={`Packet e-mail sent to ${sendAll.data.sent.length} grower${sendAll.data.sent.length === 1 ? '' : 's'}`}
        >
          {sendAll.data.skipped.length > 0
            ? `${countOf(sendAll.data.skipped.length, 'site')} skipped: ${sendAll.data.skipped.map((s) => s.reason).join('; ')}.`
            : null}
        </Alert>
      ) : null}
      {sendAll.isError ? (
        <Alert tone="danger" className="mb-6">
          {errorSummary(sendAll.error)}
        </Alert>
      ) : null}

      <div className="grid gap-8 xl:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="min-w-0 space-y-8">
          <section aria-labelledby="sites-title" className="space-y-4">
            <div className="flex flex-wrap items-end justify-between gap-3">
              <h2 id="sites-title" className="text-heading text-ink">
                Sites ({trial.sites.length})
              </h2>
              {trial.canEdit && trial.status !== 'closed' ? (
                <Button
                  variant={enrolOpen ? 'quiet' : 'secondary'}
                  onClick={() => setEnrolOpen((o) => !o)}
                  aria-expanded={enrolOpen}
                >
                  {enrolOpen ? 'Close the form' : 'Enrol a site'}
                </Button>
              ) : null}
            </div>
            {enrolOpen ? (
              <Card>
                <EnrolSiteForm trialId={trial.id} />
              </Card>
            ) : null}
            <SitesTable
              trialId={trial.id}
              sites={trial.sites}
              canEdit={trial.canEdit}
              viewerId={me?.id}
              active={active}
              extra={
                trial.canEdit && trial.status !== 'draft'
                  ? (site) => (
                      <SiteLifeActions trialId={trial.id} site={site} people={people.data ?? []} />
                    )
                  : undefined
              }
            />
          </section>
          <section aria-labelledby="rates-title" className="space-y-3">
            <h2 id="rates-title" className="text-heading text-ink">
              Seed for every rate
            </h2>
            {table.length > 0 ? (
              <RateSummaryTable
                rows={table}
                caption="Seed amounts per rate"
                unitSystem={trial.unitSystem ?? 'imperial'}
              />
            ) : (
              <p className="text-ink-muted">
                The design is not complete enough for seed amounts yet.
              </p>
            )}
          </section>
        </div>
        <aside className="space-y-6">
          <TrialLifePanel trial={trial} />
          <Card>
            <h2 className="text-heading text-ink">Design</h2>
            <TrialDesignSummary
              design={{ ...trial, customCrop: trial.customCrop ?? null }}
              stacked
              className="mt-3"
            />
            {trial.designLocked && trial.canEdit ? (
              <p className="mt-3 text-caption text-ink-muted">
                Rates and blocks are fixed: a site is randomized.
              </p>
            ) : null}
          </Card>
          <TrialLinksCard trial={trial} />
        </aside>
      </div>
    </>
  );
}

export function ErrorBoundary() {
  const error = useRouteError();
  if (!isNotFound(error)) throw error;
  return <NotFoundPanel title="No such trial" />;
}
