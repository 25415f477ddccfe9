// One trial with its design, sites and what the reader may do; and the people a coordinator can enrol.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { NetworkPersonSchema, TrialDetailSchema } from '../../../../shared/schemas/trial';
import { api } from '../../../lib/api-client';

export function trialQueryOptions(trialId: string) {
  return queryOptions({
    queryKey: ['trials', 'detail', trialId],
    queryFn: async ({ signal }) =>
      TrialDetailSchema.parse(await api.get(`/api/trials/${trialId}`, { signal })),
  });
}

export function useTrial(trialId: string) {
  return useQuery(trialQueryOptions(trialId));
}

export function trialPeopleQueryOptions(trialId: string) {
  return queryOptions({
    queryKey: ['trials', 'people', trialId],
    queryFn: async ({ signal }) =>
      z
        .array(NetworkPersonSchema)
        .parse(await api.get(`/api/trials/${trialId}/people`, { signal })),
  });
}

export function useTrialPeople(trialId: string, enabled = true) {
  return useQuery({ ...trialPeopleQueryOptions(trialId), enabled });
}
