// The site report: live for the coordinator and the site's grower, the published snapshot for members.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { SiteReportSchema } from '../../../../shared/schemas/report';
import { api } from '../../../lib/api-client';
import { reportKeys } from '../../../lib/query-keys';

export function siteReportQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: reportKeys.site(siteId),
    queryFn: ({ signal }) => api.get(`/api/sites/${siteId}/report`, SiteReportSchema, { signal }),
  });
}

export function useSiteReport(siteId: string) {
  return useQuery(siteReportQueryOptions(siteId));
}
