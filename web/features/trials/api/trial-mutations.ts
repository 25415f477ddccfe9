// Writes for trial design: create and update a trial, enrol a site, randomize, send packets.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { LayoutSchema } from '../../../../shared/schemas/layout';
import { PacketSendResultSchema, type CreateSiteInput } from '../../../../shared/schemas/site';
import {
  TrialDetailSchema,
  type CreateTrialInput,
  type UpdateTrialInput,
} from '../../../../shared/schemas/trial';
import { api } from '../../../lib/api-client';
import { siteKeys, trialKeys } from '../../../lib/query-keys';

const EnrolledSiteSchema = z.object({ id: z.uuid(), fieldName: z.string() });

export function useCreateTrial() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateTrialInput) => api.post('/api/trials', TrialDetailSchema, input),
    onSuccess: (trial) => {
      queryClient.setQueryData(trialKeys.detail(trial.id), trial);
      void queryClient.invalidateQueries({ queryKey: trialKeys.list() });
    },
  });
}

export function useUpdateTrial(trialId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateTrialInput) =>
      api.patch(`/api/trials/${trialId}`, TrialDetailSchema, input),
    onSuccess: (trial) => {
      queryClient.setQueryData(trialKeys.detail(trial.id), trial);
      void queryClient.invalidateQueries({ queryKey: trialKeys.list() });
    },
  });
}

export function useEnrolSite(trialId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateSiteInput) =>
      api.post(`/api/trials/${trialId}/sites`, EnrolledSiteSchema, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: trialKeys.all }),
  });
}

export function useRandomizeSite(trialId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { siteId: string; seed?: string }) =>
      api.post(
        `/api/sites/${input.siteId}/randomize`,
        LayoutSchema,
        input.seed ? { seed: input.seed } : {},
      ),
    onSuccess: (_layout, input) => {
      void queryClient.invalidateQueries({ queryKey: trialKeys.detail(trialId) });
      void queryClient.invalidateQueries({ queryKey: siteKeys.detail(input.siteId) });
      void queryClient.invalidateQueries({ queryKey: siteKeys.layout(input.siteId) });
    },
  });
}

export function useSendPacket() {
  return useMutation({
    mutationFn: (siteId: string) =>
      api.post(`/api/sites/${siteId}/packet/send`, PacketSendResultSchema),
  });
}

export function useSendAllPackets(trialId: string) {
  return useMutation({
    mutationFn: () => api.post(`/api/trials/${trialId}/packets/send`, PacketSendResultSchema),
  });
}
