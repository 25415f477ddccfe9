// The site report: live for the coordinator and the site's grower, the published snapshot for members.
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SiteReport } from '../../../../shared/schemas/report';
import { api } from '../../../lib/api-client';

export const siteReportQueryKey = (siteId: string) => ['reports', 'site', siteId] as const;

export function siteReportQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: siteReportQueryKey(siteId),
    queryFn: ({ signal }) => api.get<SiteReport>(`/api/sites/${siteId}/report`, { signal }),
  });
}

export function useSiteReport(siteId: string) {
  return useQuery(siteReportQueryOptions(siteId));
}
