// Site reads that several features need (packet, calculator, home): written once here, since
// features do not import each other.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { LayoutSchema } from '../../../shared/schemas/layout';
import { SiteDetailSchema, SiteSummarySchema } from '../../../shared/schemas/site';
import { api } from '../api-client';
import { siteKeys } from '../query-keys';

/** A site with its trial's design context. */
export function siteQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: siteKeys.detail(siteId),
    queryFn: ({ signal }) => api.get(`/api/sites/${siteId}`, SiteDetailSchema, { signal }),
  });
}

/** `siteId` null: nothing chosen yet, so nothing is fetched. */
export function useSite(siteId: string | null) {
  return useQuery({ ...siteQueryOptions(siteId ?? ''), enabled: Boolean(siteId) });
}

/** A site's randomized strip layout. */
export function layoutQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: siteKeys.layout(siteId),
    queryFn: ({ signal }) => api.get(`/api/sites/${siteId}/layout`, LayoutSchema, { signal }),
  });
}

export function useLayout(siteId: string) {
  return useQuery(layoutQueryOptions(siteId));
}

/** The sites where the signed-in user is the grower. */
export function mySitesQueryOptions() {
  return queryOptions({
    queryKey: siteKeys.mine(),
    queryFn: ({ signal }) => api.get('/api/sites/mine', z.array(SiteSummarySchema), { signal }),
  });
}

export function useMySites(enabled = true) {
  return useQuery({ ...mySitesQueryOptions(), enabled });
}
