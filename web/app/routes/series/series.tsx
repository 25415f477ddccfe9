// `/series/:seriesId`: the series report (every season pooled, each season beside it) and,
// for coordinators, adding trials.
import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, useRouteError, type LoaderFunctionArgs } from 'react-router-dom';
import { cropLabel } from '../../../../shared/labels/labels';
import { Card } from '../../../components/ui/card';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingBlock } from '../../../components/ui/spinner';
import { meQueryOptions } from '../../../features/auth/api/get-me';
import {
  seriesQueryOptions,
  seriesReportQueryOptions,
  useSeries,
  useSeriesReport,
} from '../../../features/series/api/series';
import { LinkTrialForm } from '../../../features/series/components/link-trial-form';
import {
  SeasonsBesidePool,
  SeasonsList,
  SeriesFindings,
  SeriesStatistics,
} from '../../../features/series/components/series-report-sections';
import { isNotFound, NotFoundPanel } from '../../route-errors';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const user = await queryClient.ensureQueryData(meQueryOptions());
    if (!user) return null;
    const seriesId = String(params.seriesId);
    await Promise.all([
      queryClient.ensureQueryData(seriesQueryOptions(seriesId)),
      queryClient.ensureQueryData(seriesReportQueryOptions(seriesId)),
    ]);
    return null;
  };

export default function SeriesPage() {
  const seriesId = String(useParams().seriesId);
  const { data: series } = useSeries(seriesId);
  const { data: report } = useSeriesReport(seriesId);
  if (!series || !report) return <LoadingBlock label="Loading the series report…" />;
  return (
    <>
      <PageHeader
        back={{ to: '/series', label: 'Series across seasons' }}
        eyebrow={`${cropLabel(series.crop)} · ${series.trials.length} ${series.trials.length === 1 ? 'season' : 'seasons'}`}
        title={series.name}
        description="Every farm in every season pooled, with each season beside the pool: how much seed the network needs, and how steady that answer is from year to year."
      />
      <div className="space-y-8">
        {report.findings.length > 0 ? <SeriesFindings findings={report.findings} /> : null}
        {report.means.rows.length > 0 ? <SeasonsBesidePool report={report} /> : null}
        <SeasonsList report={report} />
        {series.canEdit ? (
          <Card>
            <h2 className="mb-1 text-heading text-ink">Trials in this series</h2>
            <ul className="mb-4 text-label">
              {series.trials.map((trial) => (
                <li key={trial.id}>
                  <Link to={`/trials/${trial.id}`} className="text-accent hover:underline">
                    {trial.name}
                  </Link>
                </li>
              ))}
            </ul>
            <LinkTrialForm series={series} />
          </Card>
        ) : null}
        <SeriesStatistics report={report} />
      </div>
    </>
  );
}

export function ErrorBoundary() {
  const error = useRouteError();
  if (isNotFound(error)) return <NotFoundPanel title="No such series" />;
  throw error;
}
