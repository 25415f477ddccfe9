// The grower's choice of how their farm is named in network reports.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { SiteChangeResultSchema } from '../../../../shared/schemas/site-change';
import { SiteDetailSchema } from '../../../../shared/schemas/site';
import { api } from '../../../lib/api-client';

export function siteDetailQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: ['sites', siteId, 'detail'],
    queryFn: async ({ signal }) =>
      SiteDetailSchema.parse(await api.get(`/api/sites/${siteId}`, { signal })),
  });
}

export function useSiteDetail(siteId: string) {
  return useQuery(siteDetailQueryOptions(siteId));
}

export function useSetNaming(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (namedInReports: boolean) =>
      SiteChangeResultSchema.parse(await api.patch(`/api/sites/${siteId}`, { namedInReports })),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['sites', siteId] }),
  });
}
