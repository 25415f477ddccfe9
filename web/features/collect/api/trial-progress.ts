// A trial's collection progress per site, and reminder e-mails (coordinators).
import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import {
  RemindersResultSchema,
  TrialProgressSchema,
  type SendRemindersInput,
} from '../../../../shared/schemas/strip';
import { api } from '../../../lib/api-client';
import { collectKeys } from './site-strips';

export function trialProgressQueryOptions(trialId: string) {
  return queryOptions({
    queryKey: collectKeys.progress(trialId),
    queryFn: async ({ signal }) =>
      TrialProgressSchema.parse(await api.get(`/api/trials/${trialId}/progress`, { signal })),
  });
}

export function useTrialProgress(trialId: string) {
  return useQuery(trialProgressQueryOptions(trialId));
}

export function useSendReminders(trialId: string) {
  return useMutation({
    mutationFn: async (input: SendRemindersInput) =>
      RemindersResultSchema.parse(await api.post(`/api/trials/${trialId}/reminders`, input)),
  });
}
