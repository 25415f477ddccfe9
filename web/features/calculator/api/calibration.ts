// The signed-in grower's sites (to save a calibration to) and the save itself.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import {
  CalibrationRecordSchema,
  SiteDetailSchema,
  SiteSummarySchema,
  type CalibrationInput,
} from '../../../../shared/schemas/site';
import { api } from '../../../lib/api-client';

export function mySitesForCalibrationQueryOptions() {
  return queryOptions({
    queryKey: ['sites', 'mine'],
    queryFn: async ({ signal }) =>
      z.array(SiteSummarySchema).parse(await api.get('/api/sites/mine', { signal })),
  });
}

export function useMySitesForCalibration(enabled: boolean) {
  return useQuery({ ...mySitesForCalibrationQueryOptions(), enabled });
}

export function useCalibrationSite(siteId: string | null) {
  return useQuery({
    queryKey: ['sites', siteId ?? '', 'detail'],
    queryFn: async ({ signal }) =>
      SiteDetailSchema.parse(await api.get(`/api/sites/${siteId}`, { signal })),
    enabled: Boolean(siteId),
  });
}

export function useSaveCalibration(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: CalibrationInput) =>
      z
        .object({ calibrations: z.array(CalibrationRecordSchema) })
        .parse(await api.post(`/api/sites/${siteId}/calibrations`, input)),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['sites', siteId] }),
  });
}
