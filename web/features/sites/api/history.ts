// A site's history in plain words (GET /api/sites/:siteId/history).
import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { HistoryEntrySchema } from '../../../../shared/schemas/history';
import { api } from '../../../lib/api-client';

export function siteHistoryQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: ['sites', siteId, 'history'],
    queryFn: async ({ signal }) =>
      z.array(HistoryEntrySchema).parse(await api.get(`/api/sites/${siteId}/history`, { signal })),
  });
}

export function useSiteHistory(siteId: string) {
  return useQuery(siteHistoryQueryOptions(siteId));
}
