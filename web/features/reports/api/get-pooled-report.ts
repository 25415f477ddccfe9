// The pooled network report, with the reader's filters and prices; or the public copy by token.
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { PooledReportSchema, type PooledQuery } from '../../../../shared/schemas/report';
import { api } from '../../../lib/api-client';
import { reportKeys } from '../../../lib/query-keys';

/** Query string for the filters and prices that are set (empty values are left out). */
export function pooledSearch(query: PooledQuery): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined && value !== null && value !== '') params.set(key, String(value));
  }
  const text = params.toString();
  return text ? `?${text}` : '';
}

export function pooledReportQueryOptions(trialId: string, query: PooledQuery = {}) {
  return queryOptions({
    queryKey: reportKeys.pooled(trialId, query),
    queryFn: ({ signal }) =>
      api.get(`/api/trials/${trialId}/pooled-report${pooledSearch(query)}`, PooledReportSchema, {
        signal,
      }),
    placeholderData: keepPreviousData,
  });
}

export function usePooledReport(trialId: string, query: PooledQuery = {}) {
  return useQuery(pooledReportQueryOptions(trialId, query));
}

export function publicReportQueryOptions(token: string, query: PooledQuery = {}) {
  return queryOptions({
    queryKey: reportKeys.public(token, query),
    queryFn: ({ signal }) =>
      api.get(
        `/api/public/reports/${encodeURIComponent(token)}${pooledSearch(query)}`,
        PooledReportSchema,
        { signal },
      ),
    placeholderData: keepPreviousData,
  });
}

export function usePublicReport(token: string, query: PooledQuery = {}) {
  return useQuery(publicReportQueryOptions(token, query));
}
