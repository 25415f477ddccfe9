// A trial's life after design: close or reopen, delete a draft, hand a site over or mark it
// lost, and the design amendments made after sowing.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import {
  SiteChangeResultSchema,
  type SiteChangeInput,
} from '../../../../shared/schemas/site-change';
import {
  DesignAmendmentSchema,
  TrialDetailSchema,
  type TrialStatus,
} from '../../../../shared/schemas/trial';
import { api } from '../../../lib/api-client';

export function amendmentsQueryOptions(trialId: string) {
  return queryOptions({
    queryKey: ['trials', 'amendments', trialId],
    queryFn: async ({ signal }) =>
      z
        .array(DesignAmendmentSchema)
        .parse(await api.get(`/api/trials/${trialId}/amendments`, { signal })),
  });
}

export function useAmendments(trialId: string, enabled = true) {
  return useQuery({ ...amendmentsQueryOptions(trialId), enabled });
}

export function useChangeTrialStatus(trialId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (status: TrialStatus) =>
      TrialDetailSchema.parse(await api.patch(`/api/trials/${trialId}`, { status })),
    onSuccess: (trial) => {
      queryClient.setQueryData(['trials', 'detail', trialId], trial);
      void queryClient.invalidateQueries({ queryKey: ['trials', 'list'] });
    },
  });
}

export function useDeleteTrial(trialId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete(`/api/trials/${trialId}`),
    onSuccess: () => {
      queryClient.removeQueries({ queryKey: ['trials', 'detail', trialId] });
      void queryClient.invalidateQueries({ queryKey: ['trials', 'list'] });
    },
  });
}

export function useChangeSite(trialId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async ({ siteId, change }: { siteId: string; change: SiteChangeInput }) =>
      SiteChangeResultSchema.parse(await api.patch(`/api/sites/${siteId}`, change)),
    onSuccess: (_result, { siteId }) => {
      void queryClient.invalidateQueries({ queryKey: ['trials', 'detail', trialId] });
      void queryClient.invalidateQueries({ queryKey: ['sites', siteId] });
    },
  });
}
