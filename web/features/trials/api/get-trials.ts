// The trials the signed-in user can see, across all their networks.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { TrialSummarySchema } from '../../../../shared/schemas/trial';
import { api } from '../../../lib/api-client';

export function trialsQueryOptions() {
  return queryOptions({
    queryKey: ['trials', 'list'],
    queryFn: async ({ signal }) =>
      z.array(TrialSummarySchema).parse(await api.get('/api/trials', { signal })),
  });
}

export function useTrials() {
  return useQuery(trialsQueryOptions());
}
