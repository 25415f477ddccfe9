// /shared/:token: the public read-only copy of a published network report (no sign-in).
import type { QueryClient } from '@tanstack/react-query';
import {
  useParams,
  useRouteError,
  useSearchParams,
  type LoaderFunctionArgs,
} from 'react-router-dom';
import { LoadingBlock } from '../../../components/ui/spinner';
import {
  publicReportQueryOptions,
  pooledSearch,
  usePublicReport,
} from '../../../features/reports/api/get-pooled-report';
import { PooledReportView } from '../../../features/reports/components/pooled-report-view';
import { isNotFound, NotFoundPanel } from '../../route-errors';
import { queryFromSearch } from './pooled-report';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params, request }: LoaderFunctionArgs) => {
    await queryClient.ensureQueryData(
      publicReportQueryOptions(
        String(params.token),
        queryFromSearch(new URL(request.url).searchParams),
      ),
    );
    return null;
  };

export default function SharedReportPage() {
  const token = String(useParams().token);
  const [search, setSearch] = useSearchParams();
  const query = queryFromSearch(search);
  const { data, isPlaceholderData } = usePublicReport(token, query);
  if (!data) return <LoadingBlock label="Loading the report…" />;
  return (
    <PooledReportView
      report={data}
      query={query}
      isPublic
      updating={isPlaceholderData}
      onQuery={(next) =>
        setSearch(new URLSearchParams(pooledSearch(next).slice(1)), {
          replace: true,
          preventScrollReset: true,
        })
      }
    />
  );
}

export function ErrorBoundary() {
  const error = useRouteError();
  if (isNotFound(error))
    return (
      <NotFoundPanel title="This link is not active">
        The coordinator may have turned the public link off, or the report was withdrawn. Ask them
        for a new link.
      </NotFoundPanel>
    );
  throw error;
}
