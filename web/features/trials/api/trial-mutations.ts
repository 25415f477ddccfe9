// Writes for trial design: create and update a trial, enrol a site, randomize, send packets.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateSiteInput, PacketSendResult } from '../../../../shared/schemas/site';
import {
  TrialDetailSchema,
  type CreateTrialInput,
  type UpdateTrialInput,
} from '../../../../shared/schemas/trial';
import type { Layout } from '../../../../shared/schemas/layout';
import { api } from '../../../lib/api-client';

export function useCreateTrial() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: CreateTrialInput) =>
      TrialDetailSchema.parse(await api.post('/api/trials', input)),
    onSuccess: (trial) => {
      queryClient.setQueryData(['trials', 'detail', trial.id], trial);
      void queryClient.invalidateQueries({ queryKey: ['trials', 'list'] });
    },
  });
}

export function useUpdateTrial(trialId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: UpdateTrialInput) =>
      TrialDetailSchema.parse(await api.patch(`/api/trials/${trialId}`, input)),
    onSuccess: (trial) => {
      queryClient.setQueryData(['trials', 'detail', trial.id], trial);
      void queryClient.invalidateQueries({ queryKey: ['trials', 'list'] });
    },
  });
}

export function useEnrolSite(trialId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateSiteInput) =>
      api.post<{ id: string; fieldName: string }>(`/api/trials/${trialId}/sites`, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['trials'] }),
  });
}

export function useRandomizeSite(trialId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { siteId: string; seed?: string }) =>
      api.post<Layout>(
        `/api/sites/${input.siteId}/randomize`,
        input.seed ? { seed: input.seed } : {},
      ),
    onSuccess: (_layout, input) => {
      void queryClient.invalidateQueries({ queryKey: ['trials', 'detail', trialId] });
      void queryClient.invalidateQueries({ queryKey: ['sites', input.siteId] });
    },
  });
}

export function useSendPacket() {
  return useMutation({
    mutationFn: (siteId: string) => api.post<PacketSendResult>(`/api/sites/${siteId}/packet/send`),
  });
}

export function useSendAllPackets(trialId: string) {
  return useMutation({
    mutationFn: () => api.post<PacketSendResult>(`/api/trials/${trialId}/packets/send`),
  });
}
