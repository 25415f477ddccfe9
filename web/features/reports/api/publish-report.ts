// Coordinator actions: publish and unpublish site and pooled reports, and the public link.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PooledReport, PublicLink, SiteReport } from '../../../../shared/schemas/report';
import { api } from '../../../lib/api-client';
import { siteReportQueryKey } from './get-site-report';

export function usePublishSite(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (action: 'publish' | 'unpublish') =>
      api.post<SiteReport>(`/api/sites/${siteId}/${action}`),
    onSuccess: (report) => {
      queryClient.setQueryData(siteReportQueryKey(siteId), report);
      void queryClient.invalidateQueries({ queryKey: ['reports'] });
      void queryClient.invalidateQueries({ queryKey: ['sites'] });
    },
  });
}

export function usePublishTrial(trialId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (action: 'publish' | 'unpublish') =>
      api.post<PooledReport>(`/api/trials/${trialId}/${action}`),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: ['reports', 'pooled', trialId] });
      void queryClient.invalidateQueries({ queryKey: ['trials'] });
    },
  });
}

export function usePublicLink(trialId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (enabled: boolean) =>
      api.post<PublicLink>(`/api/trials/${trialId}/public-link`, { enabled }),
    onSuccess: () =>
      void queryClient.invalidateQueries({ queryKey: ['reports', 'pooled', trialId] }),
  });
}
