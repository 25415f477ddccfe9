// `/`: the signed-in home. Coordinators see their trials, growers their sites, members reports.
import { useQueries, type QueryClient } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { useRouteError } from 'react-router-dom';
import type { SessionUser } from '../../../../shared/schemas/auth';
import { Alert } from '../../../components/ui/alert';
import { Button, ButtonLink } from '../../../components/ui/button';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingBlock } from '../../../components/ui/spinner';
import { meQueryOptions, useMe } from '../../../features/auth/api/get-me';
import { GrowerReports } from './grower-reports';
import { useScopedUser } from '../../../features/networks/lib/current-network';
import { ReportList } from '../../../features/home/components/report-list';
import { SiteCardList } from '../../../features/home/components/site-card-list';
import { TrialCardList } from '../../../features/home/components/trial-card-list';
import { mySitesQueryOptions, useMySites } from '../../../lib/queries/sites';
import { trialQueryOptions } from '../../../features/trials/api/get-trial';
import { trialsQueryOptions, useTrials } from '../../../features/trials/api/get-trials';
import { errorSummary } from '../../../lib/form-errors';
import { firstName, homeKind } from '../../../lib/session';
import { isNotFound, NotFoundPanel } from '../../route-errors';

export const clientLoader = (queryClient: QueryClient) => async () => {
  const user = await queryClient.ensureQueryData(meQueryOptions());
  if (!user) return null;
  const kind = homeKind(user);
  if (kind === 'grower') {
    await queryClient.ensureQueryData(mySitesQueryOptions());
  } else {
    const trials = await queryClient.ensureQueryData(trialsQueryOptions());
    // A member's list names each published report, which the trial's detail lists.
    if (kind === 'member') {
      await Promise.all(trials.map((t) => queryClient.ensureQueryData(trialQueryOptions(t.id))));
    }
  }
  return null;
};

function networkLine(user: SessionUser): string {
  const names = [...new Set(user.memberships.map((m) => m.networkName))];
  return names.join(' · ');
}

/** Loading and error states for one list, so each home variant reads the same way. */
function QueryState<T>({
  query,
  loadingLabel,
  children,
}: {
  query: {
    data: T | undefined;
    isError: boolean;
    error: unknown;
    refetch: () => unknown;
    isRefetching: boolean;
  };
  loadingLabel: string;
  children: (data: T) => ReactNode;
}) {
  if (query.data !== undefined) return <>{children(query.data)}</>;
  if (query.isError) {
    return (
      <Alert
        tone="danger"
        title="Could not load this list"
        action={
          <Button variant="secondary" onClick={() => query.refetch()} busy={query.isRefetching}>
            Try again
          </Button>
        }
      >
        {errorSummary(query.error)}
      </Alert>
    );
  }
  return <LoadingBlock label={loadingLabel} />;
}

/** Only the trials of the network chosen in the header. */
function inNetwork<T extends { networkId: string }>(user: SessionUser, items: readonly T[]): T[] {
  const ids = new Set(user.memberships.map((m) => m.networkId));
  return items.filter((item) => ids.has(item.networkId));
}

function CoordinatorHome({ user }: { user: SessionUser }) {
  const trials = useTrials();
  return (
    <>
      <PageHeader
        eyebrow={networkLine(user)}
        title="Trials"
        description="Each trial compares seeding rates across growers’ fields. Open one to enrol sites, randomize strips and check the numbers coming in."
        actions={<ButtonLink to="/trials/new">New trial</ButtonLink>}
      />
      <QueryState query={trials} loadingLabel="Loading trials…">
        {(data) => <TrialCardList trials={inNetwork(user, data)} />}
      </QueryState>
    </>
  );
}

function GrowerHome({ user }: { user: SessionUser }) {
  const sites = useMySites();
  return (
    <>
      <PageHeader
        eyebrow={networkLine(user)}
        title={`Hello, ${firstName(user)}`}
        description="Your fields in this season’s trials. Open a site for its strip map, seed weights per strip and the forms for counts and yields."
      />
      <QueryState query={sites} loadingLabel="Loading your sites…">
        {(data) => <SiteCardList sites={data} />}
      </QueryState>
      <GrowerReports networkIds={user.memberships.map((m) => m.networkId)} />
    </>
  );
}

function MemberHome({ user }: { user: SessionUser }) {
  const trials = useTrials();
  const details = useQueries({
    queries: inNetwork(user, trials.data ?? []).map((t) => trialQueryOptions(t.id)),
    combine: (results) => ({
      data: results.every((r) => r.data) ? results.map((r) => r.data!) : undefined,
      isError: results.some((r) => r.isError),
      error: results.find((r) => r.error)?.error,
      isRefetching: results.some((r) => r.isRefetching),
      refetch: () => results.forEach((r) => void r.refetch()),
    }),
  });
  return (
    <>
      <PageHeader
        eyebrow={networkLine(user)}
        title="Reports"
        description="What the network’s rate strips showed, site by site and pooled across farms."
      />
      {trials.data === undefined ? (
        <QueryState query={trials} loadingLabel="Loading reports…">
          {() => null}
        </QueryState>
      ) : (
        <QueryState query={details} loadingLabel="Loading reports…">
          {(data) => <ReportList trials={data} />}
        </QueryState>
      )}
    </>
  );
}

export default function HomePage() {
  const { data: me } = useMe();
  const user = useScopedUser(me);
  if (!user) return <LoadingBlock />;
  const kind = homeKind(user);
  if (kind === 'coordinator') return <CoordinatorHome user={user} />;
  if (kind === 'grower') return <GrowerHome user={user} />;
  return <MemberHome user={user} />;
}

export function ErrorBoundary() {
  const error = useRouteError();
  if (!isNotFound(error)) throw error;
  return <NotFoundPanel />;
}
