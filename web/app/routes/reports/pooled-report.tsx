// /trials/:trialId/report: the pooled network report with filters and adjustable prices.
import type { QueryClient } from '@tanstack/react-query';
import {
  useParams,
  useRouteError,
  useSearchParams,
  type LoaderFunctionArgs,
} from 'react-router-dom';
import { PooledQuerySchema, type PooledQuery } from '../../../../shared/schemas/report';
import { LoadingBlock } from '../../../components/ui/spinner';
import { meQueryOptions, useMe } from '../../../features/auth/api/get-me';
import { homeKind } from '../../../lib/session';
import {
  pooledReportQueryOptions,
  pooledSearch,
  usePooledReport,
} from '../../../features/reports/api/get-pooled-report';
import { PooledReportView } from '../../../features/reports/components/pooled-report-view';
import { isApiError } from '../../../lib/api-client';
import { AmendmentsNotice } from '../../../features/reports/components/amendments-notice';
import { reportDisplayUnits } from '../../../../shared/units/report-units';
import { isNotFound, NotFoundPanel } from '../../route-errors';
import { NotPublishedPanel } from './not-published';

/** Filters and prices live in the address, so a filtered view can be bookmarked or shared. */
export function queryFromSearch(search: URLSearchParams): PooledQuery {
  const parsed = PooledQuerySchema.safeParse(Object.fromEntries(search));
  return parsed.success ? parsed.data : {};
}

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params, request }: LoaderFunctionArgs) => {
    const user = await queryClient.ensureQueryData(meQueryOptions());
    if (!user) return null;
    await queryClient.ensureQueryData(
      pooledReportQueryOptions(
        String(params.trialId),
        queryFromSearch(new URL(request.url).searchParams),
      ),
    );
    return null;
  };

export default function PooledReportPage() {
  const trialId = String(useParams().trialId);
  const [search, setSearch] = useSearchParams();
  const query = queryFromSearch(search);
  const { data, isPlaceholderData } = usePooledReport(trialId, query);
  const { data: user } = useMe();
  if (!data) return <LoadingBlock label="Loading the network report…" />;
  const back =
    data.canPublish || (user && homeKind(user) !== 'member')
      ? { to: `/trials/${trialId}`, label: data.trial.name }
      : { to: '/', label: 'Reports' };
  return (
    <>
      <AmendmentsNotice
        trialId={trialId}
        system={reportDisplayUnits(data.trial.units, data.trial.crop).system}
      />
      <PooledReportView
        back={back}
        report={data}
        query={query}
        updating={isPlaceholderData}
        onQuery={(next) =>
          setSearch(new URLSearchParams(pooledSearch(next).slice(1)), {
            replace: true,
            preventScrollReset: true,
          })
        }
      />
    </>
  );
}

export function ErrorBoundary() {
  const error = useRouteError();
  if (isNotFound(error)) return <NotFoundPanel title="No such trial report" />;
  if (isApiError(error, 403)) return <NotPublishedPanel what="network report" />;
  throw error;
}
