// The sites where the signed-in user is the grower.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { SiteSummarySchema } from '../../../../shared/schemas/site';
import { api } from '../../../lib/api-client';

export function mySitesQueryOptions() {
  return queryOptions({
    queryKey: ['sites', 'mine'],
    queryFn: async ({ signal }) =>
      z.array(SiteSummarySchema).parse(await api.get('/api/sites/mine', { signal })),
  });
}

export function useMySites() {
  return useQuery(mySitesQueryOptions());
}
