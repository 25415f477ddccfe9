// The trials the signed-in user can see, across all their networks.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { TrialSummarySchema } from '../../../../shared/schemas/trial';
import { api } from '../../../lib/api-client';
import { trialKeys } from '../../../lib/query-keys';

export function trialsQueryOptions() {
  return queryOptions({
    queryKey: trialKeys.list(),
    queryFn: ({ signal }) => api.get('/api/trials', z.array(TrialSummarySchema), { signal }),
  });
}

export function useTrials() {
  return useQuery(trialsQueryOptions());
}
