// Coordinator actions: publish and unpublish site and pooled reports, and the public link.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  PooledReportSchema,
  PublicLinkSchema,
  SiteReportSchema,
} from '../../../../shared/schemas/report';
import { api } from '../../../lib/api-client';
import { reportKeys, siteKeys, trialKeys } from '../../../lib/query-keys';

export function usePublishSite(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (action: 'publish' | 'unpublish') =>
      api.post(`/api/sites/${siteId}/${action}`, SiteReportSchema),
    onSuccess: (report) => {
      queryClient.setQueryData(reportKeys.site(siteId), report);
      void queryClient.invalidateQueries({ queryKey: reportKeys.all });
      void queryClient.invalidateQueries({ queryKey: siteKeys.all });
    },
  });
}

export function usePublishTrial(trialId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (action: 'publish' | 'unpublish') =>
      api.post(`/api/trials/${trialId}/${action}`, PooledReportSchema),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: reportKeys.pooledAll(trialId) });
      void queryClient.invalidateQueries({ queryKey: trialKeys.all });
    },
  });
}

export function usePublicLink(trialId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (enabled: boolean) =>
      api.post(`/api/trials/${trialId}/public-link`, PublicLinkSchema, { enabled }),
    onSuccess: () =>
      void queryClient.invalidateQueries({ queryKey: reportKeys.pooledAll(trialId) }),
  });
}
