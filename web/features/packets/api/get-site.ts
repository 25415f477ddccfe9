// A site with its trial's design context, and its randomized strip layout.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { LayoutSchema } from '../../../../shared/schemas/layout';
import { SiteDetailSchema } from '../../../../shared/schemas/site';
import { api } from '../../../lib/api-client';

export function siteQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: ['sites', siteId, 'detail'],
    queryFn: async ({ signal }) =>
      SiteDetailSchema.parse(await api.get(`/api/sites/${siteId}`, { signal })),
  });
}

export function useSite(siteId: string) {
  return useQuery(siteQueryOptions(siteId));
}

export function layoutQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: ['sites', siteId, 'layout'],
    queryFn: async ({ signal }) =>
      LayoutSchema.parse(await api.get(`/api/sites/${siteId}/layout`, { signal })),
  });
}

export function useLayout(siteId: string) {
  return useQuery(layoutQueryOptions(siteId));
}
