// Series reads and writes: the list, one series, its report; start a series, link a trial.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import {
  SeriesDetailSchema,
  SeriesReportSchema,
  SeriesSummarySchema,
  type CreateSeriesInput,
} from '../../../../shared/schemas/series';
import { api } from '../../../lib/api-client';
import { seriesKeys, trialKeys } from '../../../lib/query-keys';

export function seriesListQueryOptions() {
  return queryOptions({
    queryKey: seriesKeys.list(),
    queryFn: ({ signal }) => api.get('/api/series', z.array(SeriesSummarySchema), { signal }),
  });
}

export function useSeriesList() {
  return useQuery(seriesListQueryOptions());
}

export function seriesQueryOptions(seriesId: string) {
  return queryOptions({
    queryKey: seriesKeys.detail(seriesId),
    queryFn: ({ signal }) => api.get(`/api/series/${seriesId}`, SeriesDetailSchema, { signal }),
  });
}

export function useSeries(seriesId: string) {
  return useQuery(seriesQueryOptions(seriesId));
}

export function seriesReportQueryOptions(seriesId: string) {
  return queryOptions({
    queryKey: seriesKeys.report(seriesId),
    queryFn: ({ signal }) =>
      api.get(`/api/series/${seriesId}/report`, SeriesReportSchema, { signal }),
  });
}

export function useSeriesReport(seriesId: string) {
  return useQuery(seriesReportQueryOptions(seriesId));
}

export function useCreateSeries() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateSeriesInput) => api.post('/api/series', SeriesDetailSchema, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: seriesKeys.all }),
  });
}

const LinkedSchema = z.object({ trialId: z.uuid(), seriesId: z.uuid().nullable() });

export function useLinkTrial() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ trialId, seriesId }: { trialId: string; seriesId: string | null }) =>
      api.put(`/api/trials/${trialId}/series`, LinkedSchema, { seriesId }),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: seriesKeys.all });
      await queryClient.invalidateQueries({ queryKey: trialKeys.all });
    },
  });
}
