// `/series`: the network's series of trials across seasons; coordinators start a new one.
import type { QueryClient } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { cropLabel } from '../../../../shared/labels/labels';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingBlock } from '../../../components/ui/spinner';
import { meQueryOptions, useMe } from '../../../features/auth/api/get-me';
import { useCurrentNetworkId } from '../../../features/networks/lib/current-network';
import { seriesListQueryOptions, useSeriesList } from '../../../features/series/api/series';
import { CreateSeriesForm } from '../../../features/series/components/create-series-form';

export const clientLoader = (queryClient: QueryClient) => async () => {
  const user = await queryClient.ensureQueryData(meQueryOptions());
  if (!user) return null;
  await queryClient.ensureQueryData(seriesListQueryOptions());
  return null;
};

export default function SeriesListPage() {
  const { data: list } = useSeriesList();
  const { data: user } = useMe();
  const networkId = useCurrentNetworkId(user);
  if (!list || !user) return <LoadingBlock label="Loading the series…" />;
  const role = user.memberships.find((m) => m.networkId === networkId)?.role;
  const coordinating = role === 'coordinator' || role === 'admin';
  const mine = list.filter((series) => series.networkId === networkId);
  return (
    <>
      <PageHeader
        back={{ to: '/', label: 'Home' }}
        title="Series across seasons"
        description="One season can mislead. A series links the trials of one crop from season to season, so the network reads them together and sees whether the answer holds."
      />
      <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
        <div className="space-y-3">
          {mine.length === 0 ? (
            <EmptyState title="No series yet">
              {coordinating
                ? 'Start one, then add this season’s trial and last season’s.'
                : 'Your coordinator can link trials of one crop across seasons.'}
            </EmptyState>
          ) : (
            mine.map((series) => (
              <Card key={series.id}>
                <h2 className="text-heading text-ink">
                  <Link to={`/series/${series.id}`} className="text-accent hover:underline">
                    {series.name}
                  </Link>
                </h2>
                <p className="text-label text-ink-muted">
                  {cropLabel(series.crop)} ·{' '}
                  {series.trials.length === 0
                    ? 'no trials yet'
                    : series.trials.map((t) => t.season ?? t.name).join(', ')}
                </p>
              </Card>
            ))
          )}
        </div>
        {coordinating && networkId ? (
          <Card>
            <h2 className="mb-3 text-heading text-ink">Start a series</h2>
            <CreateSeriesForm networkId={networkId} />
          </Card>
        ) : null}
      </div>
    </>
  );
}
