// GET /api/sites/:siteId/audit: who changed what on a site (coordinators).
import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { AuditEventSchema } from '../../../../shared/schemas/strip';
import { api } from '../../../lib/api-client';
import { collectKeys } from './site-strips';

export function siteAuditQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: collectKeys.audit(siteId),
    queryFn: async ({ signal }) =>
      z.array(AuditEventSchema).parse(await api.get(`/api/sites/${siteId}/audit`, { signal })),
  });
}

export function useSiteAudit(siteId: string) {
  return useQuery(siteAuditQueryOptions(siteId));
}
