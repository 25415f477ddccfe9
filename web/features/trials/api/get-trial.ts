// One trial with its design, sites and what the reader may do; and the people a coordinator can enrol.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { NetworkPersonSchema, TrialDetailSchema } from '../../../../shared/schemas/trial';
import { api } from '../../../lib/api-client';
import { trialKeys } from '../../../lib/query-keys';

export function trialQueryOptions(trialId: string) {
  return queryOptions({
    queryKey: trialKeys.detail(trialId),
    queryFn: ({ signal }) => api.get(`/api/trials/${trialId}`, TrialDetailSchema, { signal }),
  });
}

export function useTrial(trialId: string) {
  return useQuery(trialQueryOptions(trialId));
}

export function trialPeopleQueryOptions(trialId: string) {
  return queryOptions({
    queryKey: trialKeys.people(trialId),
    queryFn: ({ signal }) =>
      api.get(`/api/trials/${trialId}/people`, z.array(NetworkPersonSchema), { signal }),
  });
}

export function useTrialPeople(trialId: string, enabled = true) {
  return useQuery({ ...trialPeopleQueryOptions(trialId), enabled });
}
