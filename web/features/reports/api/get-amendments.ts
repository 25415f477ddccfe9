// Design amendments made after sowing, shown on the trial's reports.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { DesignAmendmentSchema } from '../../../../shared/schemas/trial';
import { api } from '../../../lib/api-client';

export function reportAmendmentsQueryOptions(trialId: string) {
  return queryOptions({
    queryKey: ['trials', 'amendments', trialId],
    queryFn: async ({ signal }) =>
      z
        .array(DesignAmendmentSchema)
        .parse(await api.get(`/api/trials/${trialId}/amendments`, { signal })),
  });
}

export function useReportAmendments(trialId: string) {
  return useQuery({ ...reportAmendmentsQueryOptions(trialId), retry: false });
}
