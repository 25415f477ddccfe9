// A site's strips with values, derived numbers and warnings: the data behind every collect page.
import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import { SiteStripsSchema, type SiteStrips, type StripDto } from '../../../../shared/schemas/strip';
import { api } from '../../../lib/api-client';

export const collectKeys = {
  all: ['collect'] as const,
  site: (siteId: string) => ['collect', 'site', siteId] as const,
  photos: (siteId: string) => ['collect', 'photos', siteId] as const,
  audit: (siteId: string) => ['collect', 'audit', siteId] as const,
  progress: (trialId: string) => ['collect', 'progress', trialId] as const,
};

export function siteStripsQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: collectKeys.site(siteId),
    queryFn: async ({ signal }) =>
      SiteStripsSchema.parse(await api.get(`/api/sites/${siteId}/strips`, { signal })),
    staleTime: 10_000,
  });
}

export function useSiteStrips(siteId: string) {
  return useQuery(siteStripsQueryOptions(siteId));
}

/** Puts a strip the server answered with into the cached site list. */
export function storeStrip(queryClient: QueryClient, strip: StripDto): void {
  queryClient.setQueryData<SiteStrips>(collectKeys.site(strip.siteId), (old) =>
    old
      ? { ...old, strips: old.strips.map((s) => (s.stripId === strip.stripId ? strip : s)) }
      : old,
  );
}
